/**
 * Approving a reconciled set whole: the drafts one reconciliation wrote add up only together, so approving
 * some of them without the rest would leave the approved numbers of the hierarchy disagreeing again.
 */
import { forecastReconciliations, forecastVersions, series } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';
import { and, eq, inArray, sql } from 'drizzle-orm';
import type { Reader } from './forecast-repository';

/** Throws a conflict when `versionIds` hold part of a reconciled set whose other drafts are left out. */
export async function assertWholeReconciledSets(db: Reader, versionIds: number[]): Promise<void> {
  if (versionIds.length === 0) return;
  const sets = await db
    .select({ id: forecastReconciliations.id, versionIds: forecastReconciliations.versionIds, rootKey: series.key })
    .from(forecastReconciliations)
    .innerJoin(series, eq(series.id, forecastReconciliations.rootSeriesId))
    .where(sql`${forecastReconciliations.versionIds} && ${`{${versionIds.join(',')}}`}::bigint[]`);
  const asked = new Set(versionIds);
  const errors: { pointer: string; detail: string }[] = [];
  for (const set of sets) {
    const stillDraft = await db
      .select({ id: forecastVersions.id })
      .from(forecastVersions)
      .where(and(inArray(forecastVersions.id, set.versionIds), eq(forecastVersions.state, 'draft')));
    const left = stillDraft.filter((v) => !asked.has(v.id)).map((v) => v.id);
    if (left.length === 0) continue;
    const index = versionIds.findIndex((id) => set.versionIds.includes(id));
    errors.push({
      pointer: `/versionIds/${index}`,
      detail: `Forecast version ${versionIds[index]} was reconciled across ${set.rootKey} with ${set.versionIds.length - 1} others; ${left.length} of them (${left.join(', ')}) are not in this approval. Approve the group ${set.rootKey} so the approved numbers add up.`,
    });
  }
  if (errors.length > 0) throw new HttpProblem('conflict', errors.map((e) => e.detail).join(' '), errors);
}
