/** Which series a preview or an export covers: listed ones, a node and its descendants, or all. */
import type { ForecastSeries } from '@loadwright/contracts';
import { HttpProblem } from '@loadwright/problems';
import { findSeries, seriesInScope, type Reader } from './forecast-repository';

/** The series in scope, and a short name for the scope (for file names). */
export interface ResolvedScope {
  series: ForecastSeries[];
  name: string;
}

/**
 * Resolves `parentId` (it and every descendant), `seriesIds` (exactly those; every id must be a
 * load series) or neither (every active load series). Unknown ids are a not-found problem.
 */
export async function resolveSeriesScope(
  db: Reader,
  request: { seriesIds?: readonly number[]; parentId?: number },
): Promise<ResolvedScope> {
  if (request.parentId !== undefined) {
    const parent = await findSeries(db, request.parentId);
    if (!parent) throw new HttpProblem('notFound', `No series with id ${request.parentId}.`);
    return { series: await seriesInScope(db, { kind: 'subtree', rootId: parent.id }), name: parent.key };
  }
  if (request.seriesIds !== undefined) {
    const ids = [...new Set(request.seriesIds)];
    const series = await seriesInScope(db, { kind: 'series', ids });
    const found = new Set(series.map((row) => row.id));
    const missing = ids.filter((id) => !found.has(id));
    if (missing.length > 0) throw new HttpProblem('notFound', `No load series with id ${missing.join(', ')}.`);
    return { series, name: series.length === 1 ? series[0]!.key : `${series.length}-series` };
  }
  return { series: await seriesInScope(db, { kind: 'all' }), name: 'system' };
}
