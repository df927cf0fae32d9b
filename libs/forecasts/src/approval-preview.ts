/**
 * What approving the current drafts of some series or of a group would change: for each series the
 * draft's and the approved version's peak over their horizons, and the energy difference over the
 * intervals both cover (adjusted numbers where adjusted).
 */
import {
  versionTimeliness,
  type ApprovalPreview,
  type ApprovalPreviewItem,
  type ApprovalPreviewRequest,
  type ForecastSeries,
} from '@loadwright/contracts';
import type { Database } from '@loadwright/db';
import { horizonPeak } from './daily-peaks';
import { adjustmentsOf, currentVersions, pointsOf } from './forecast-repository';
import { effectiveValues, versionEnd } from './forecast-review';
import { resolveSeriesScope } from './series-scope';
import { energyDifference, percentDifference } from './version-comparison';

/** Series whose versions a preview loads per round trip. */
const seriesPerBatch = 200;

/**
 * What approving the current drafts of the series in scope would change, series by series. Stale
 * drafts (most of their hours passed) are listed but left out of the ids to approve unless the
 * request includes them: a group approval never slips an old week in beside current ones.
 */
export async function previewApprovals(db: Database, request: ApprovalPreviewRequest, now = new Date()): Promise<ApprovalPreview> {
  const inScope = (await resolveSeriesScope(db, request)).series;
  const items: ApprovalPreviewItem[] = [];
  // A batch of series at a time, so a whole-system preview never holds every point at once.
  for (let start = 0; start < inScope.length; start += seriesPerBatch) {
    items.push(...(await previewBatch(db, inScope.slice(start, start + seriesPerBatch), now)));
  }
  const drafts = items.flatMap((item) => (item.draft ? [item.draft] : []));
  const staleVersionIds = drafts.filter((draft) => draft.stale).map((draft) => draft.versionId);
  const versionIds = drafts.filter((draft) => request.includeStale || !draft.stale).map((draft) => draft.versionId);
  return { items, versionIds, withoutDraft: items.length - drafts.length, staleVersionIds };
}

/** Preview items of some series: their current draft and approved versions compared. */
async function previewBatch(db: Database, inScope: ForecastSeries[], now: Date): Promise<ApprovalPreviewItem[]> {
  const versions = await currentVersions(
    db,
    inScope.map((row) => row.id),
  );
  const ids = versions.map((row) => row.id);
  const [points, adjustments] = await Promise.all([pointsOf(db, ids), adjustmentsOf(db, ids)]);

  return inScope.map((seriesRow) => {
    const draft = versions.find((row) => row.seriesId === seriesRow.id && row.state === 'draft');
    const approved = versions.find((row) => row.seriesId === seriesRow.id && row.state === 'approved');
    const draftValues = draft ? effectiveValues(points.get(draft.id)!, adjustments.get(draft.id)!) : [];
    const approvedValues = approved ? effectiveValues(points.get(approved.id)!, adjustments.get(approved.id)!) : [];
    const draftPeak = horizonPeak(draftValues, seriesRow.timeZone);
    const approvedPeak = horizonPeak(approvedValues, seriesRow.timeZone);
    const bothPeaks = draftPeak !== null && approvedPeak !== null;
    return {
      series: seriesRow,
      draft: draft
        ? {
            versionId: draft.id,
            issuedAt: draft.issuedAt.toISOString(),
            origin: draft.origin.toISOString(),
            adjustmentCount: draft.adjustmentCount,
            peak: draftPeak,
            end: versionEnd(draft).toISOString(),
            ...pick(versionTimeliness(draft, now), 'hoursAhead', 'stale'),
          }
        : null,
      approved: approved
        ? {
            versionId: approved.id,
            approvedAt: approved.approvedAt?.toISOString() ?? null,
            origin: approved.origin.toISOString(),
            peak: approvedPeak,
          }
        : null,
      peakDifference: bothPeaks ? draftPeak.value - approvedPeak.value : null,
      peakDifferencePercent: bothPeaks ? percentDifference(draftPeak.value, approvedPeak.value) : null,
      energy: draft && approved ? energyDifference(draftValues, approvedValues, seriesRow.intervalMinutes) : null,
    };
  });
}

/** The named fields of an object. */
function pick<T extends object, K extends keyof T>(value: T, ...keys: K[]): Pick<T, K> {
  return Object.fromEntries(keys.map((key) => [key, value[key]])) as Pick<T, K>;
}
