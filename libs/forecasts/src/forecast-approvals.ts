/**
 * Approving drafts, one or many at once.
 *
 * Approval runs in one transaction that first locks the rows of the series involved (FOR NO KEY
 * UPDATE, in id order so two bulk approvals cannot deadlock; NO KEY leaves readings and refits that
 * only reference the series unblocked), then re-reads the versions under lock. Two approvals of one
 * series therefore run one after the other, and the second sees the first's result: exactly one
 * version of a series is ever approved. The previous approved version is superseded in the same
 * transaction; the database's immutability triggers keep approved versions as they were approved.
 */
import { versionTimeliness, type ApprovalResult } from '@loadwright/contracts';
import { forecastVersions, type Database } from '@loadwright/db';
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { recordAudit } from '@loadwright/audit';
import { HttpProblem } from '@loadwright/problems';
import type { Caller } from './forecast-adjustments';
import { assertWholeReconciledSets } from './reconciled-sets';

/** Why a listed version could not be approved. */
function staleReason(versionId: number, state: string | undefined): string {
  if (state === undefined) return `No forecast version with id ${versionId}.`;
  if (state === 'approved') return `Forecast version ${versionId} is approved already.`;
  return `Forecast version ${versionId} is ${state}: a newer draft replaced it. Preview again and approve the current drafts.`;
}

/**
 * Approves the listed drafts together, all or none. `single` makes a missing version a 404 and a
 * non-draft a plain conflict; otherwise every version that cannot be approved is listed in the
 * conflict's errors. A group approval (not `single`) also refuses drafts whose hours have mostly
 * passed unless `includeStale` says the planner chose them; the series page approves one draft
 * after showing its own warning.
 */
export async function approveVersions(
  db: Database,
  versionIds: number[],
  { actor, ip }: Caller,
  options: { single?: boolean; includeStale?: boolean; now?: Date } = {},
): Promise<ApprovalResult> {
  const now = options.now ?? new Date();
  return db.transaction(async (tx) => {
    const candidates = await tx
      .select({ id: forecastVersions.id, seriesId: forecastVersions.seriesId })
      .from(forecastVersions)
      .where(inArray(forecastVersions.id, versionIds));
    if (options.single && candidates.length === 0) throw new HttpProblem('notFound', `No forecast version with id ${versionIds[0]}.`);

    const seriesIds = [...new Set(candidates.map((candidate) => candidate.seriesId))].sort((a, b) => a - b);
    if (seriesIds.length > 0) {
      await tx.execute(
        sql`select id from series where id in (${sql.join(
          seriesIds.map((id) => sql`${id}`),
          sql`, `,
        )}) order by id for no key update`,
      );
    }
    const locked = await tx
      .select({
        id: forecastVersions.id,
        seriesId: forecastVersions.seriesId,
        state: forecastVersions.state,
        origin: forecastVersions.origin,
        horizonHours: forecastVersions.horizonHours,
      })
      .from(forecastVersions)
      .where(inArray(forecastVersions.id, versionIds))
      .orderBy(asc(forecastVersions.id))
      .for('update');
    const byId = new Map(locked.map((row) => [row.id, row]));

    const stale = versionIds.flatMap((id, index) => {
      const row = byId.get(id);
      if (row?.state !== 'draft') return [{ pointer: `/versionIds/${index}`, detail: staleReason(id, row?.state) }];
      const timeliness = versionTimeliness(row, now);
      if (options.single || options.includeStale || !timeliness.stale) return [];
      return [
        {
          pointer: `/versionIds/${index}`,
          detail: `Forecast version ${id} has ${timeliness.hoursPassed} of its ${row.horizonHours} hours behind it: leave it out, or include stale drafts on purpose.`,
        },
      ];
    });
    // A series has at most one draft (a partial unique index), so the drafts left belong to distinct series.
    if (stale.length > 0) {
      if (options.single) throw new HttpProblem('conflict', stale[0]!.detail);
      throw new HttpProblem(
        'conflict',
        `${stale.length} of ${versionIds.length} versions cannot be approved; nothing was approved. Preview again and approve the current drafts.`,
        stale,
      );
    }

    await assertWholeReconciledSets(tx, versionIds);
    const approvedAt = new Date();
    const superseded = await tx
      .update(forecastVersions)
      .set({ state: 'superseded', supersededAt: approvedAt })
      .where(and(inArray(forecastVersions.seriesId, seriesIds), eq(forecastVersions.state, 'approved')))
      .returning({ id: forecastVersions.id, seriesId: forecastVersions.seriesId });
    await tx
      .update(forecastVersions)
      .set({ state: 'approved', approvedAt, approvedById: actor.kind === 'user' ? actor.userId : null })
      .where(inArray(forecastVersions.id, versionIds));

    const supersededBySeries = new Map(superseded.map((row) => [row.seriesId, row.id]));
    const approved = versionIds.map((id) => {
      const seriesId = byId.get(id)!.seriesId;
      return { versionId: id, seriesId, supersededVersionId: supersededBySeries.get(seriesId) ?? null };
    });
    for (const entry of approved) {
      await recordAudit(tx, {
        actor,
        action: 'forecast.approved',
        targetType: 'forecast_version',
        targetId: entry.versionId,
        detail: { seriesId: entry.seriesId, supersededVersionId: entry.supersededVersionId, together: versionIds.length },
        ip,
      });
    }
    return { approvedAt: approvedAt.toISOString(), approved };
  });
}
