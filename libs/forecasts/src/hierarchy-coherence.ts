/**
 * How far a parent's forecast is from the sum of its children's, hour by hour: the coherence view of the
 * series page and the group approval. Compares the current drafts or the approved versions, adjusted
 * numbers where adjusted, children converted to the parent's unit. When the parent's version was written
 * by a reconciliation, the remainder (unmetered load and losses) it allotted is part of the sum.
 */
import type { ForecastSeries, HierarchyCoherence, CoherenceHour } from '@loadwright/contracts';
import { forecastReconciliations } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';
import { desc, sql } from 'drizzle-orm';
import { adjustmentsOf, currentVersions, findSeries, pointsOf, seriesInScope, type Reader } from './forecast-repository';
import { effectiveValues } from './forecast-review';
import { unitScale } from './unit-scale';

/** |gap| at most this share of the parent counts as adding up (rounding of stored doubles and unit scales). */
const coherentShare = 1e-6;

/** A series and its direct children (load series, not archived); a problem when it has none. */
export async function parentAndChildren(db: Reader, parentId: number): Promise<{ parent: ForecastSeries; children: ForecastSeries[] }> {
  const parent = await findSeries(db, parentId);
  if (!parent || parent.level === null) throw new HttpProblem('notFound', `No load series with id ${parentId}.`);
  const subtree = await seriesInScope(db, { kind: 'subtree', rootId: parent.id });
  const children = subtree.filter((row) => row.parentId === parent.id);
  if (children.length === 0) {
    throw new HttpProblem(
      'conflict',
      `${parent.name} (${parent.key}) has no series under it: coherence compares a parent with its children.`,
    );
  }
  return { parent, children };
}

/** The latest reconciliation that wrote a version, if any. */
export async function reconciliationOfVersion(db: Reader, versionId: number) {
  const [row] = await db
    .select()
    .from(forecastReconciliations)
    .where(sql`${forecastReconciliations.versionIds} @> array[${versionId}]::bigint[]`)
    .orderBy(desc(forecastReconciliations.id))
    .limit(1);
  return row ?? null;
}

/** The parent's forecast against the sum of its children, hour by hour; see the file comment. */
export async function hierarchyCoherence(db: Reader, parentId: number, state: 'draft' | 'approved'): Promise<HierarchyCoherence> {
  const { parent, children } = await parentAndChildren(db, parentId);
  const versions = (await currentVersions(db, [parent.id, ...children.map((c) => c.id)])).filter((v) => v.state === state);
  const versionOf = new Map(versions.map((v) => [v.seriesId, v]));
  const ids = versions.map((v) => v.id);
  const [points, adjustments] = await Promise.all([pointsOf(db, ids), adjustmentsOf(db, ids)]);
  const valuesOf = (seriesId: number): Map<number, number> => {
    const version = versionOf.get(seriesId);
    if (!version) return new Map();
    return new Map(effectiveValues(points.get(version.id)!, adjustments.get(version.id)!).map((p) => [p.ts.getTime(), p.value]));
  };
  const notes: string[] = [];
  const missing = state === 'draft' ? 'draft' : 'approved version';
  const parentVersion = versionOf.get(parent.id) ?? null;
  if (!parentVersion) notes.push(`${parent.name} (${parent.key}) has no ${missing} to compare.`);
  const childValues = children.map((child) => {
    if (!versionOf.has(child.id)) notes.push(`${child.name} (${child.key}) has no ${missing}: the sum leaves it out.`);
    const scale = unitScale(child.unit, parent.unit);
    return { values: valuesOf(child.id), scale };
  });

  const reconciliation = parentVersion ? await reconciliationOfVersion(db, parentVersion.id) : null;
  const remainder = new Map<number, number>();
  if (reconciliation) {
    const allotted = reconciliation.remainders.find((r) => r.parentSeriesId === parent.id);
    allotted?.mean.forEach((value, h) => remainder.set(reconciliation.origin.getTime() + h * 3_600_000, value));
  }
  const wholeSet = reconciliation !== null && children.every((c) => reconciliation.versionIds.includes(versionOf.get(c.id)?.id ?? -1));
  if (reconciliation && !wholeSet) notes.push('Some children were not written by the same reconciliation as the parent.');

  const hours: CoherenceHour[] = [];
  for (const [ms, value] of valuesOf(parent.id)) {
    let sum: number | null = 0;
    for (const child of childValues) {
      const childValue = child.values.get(ms);
      if (childValue === undefined) {
        sum = null;
        break;
      }
      sum += childValue * child.scale;
    }
    const allotted = remainder.get(ms) ?? null;
    const gap = sum === null ? null : value - sum - (allotted ?? 0);
    hours.push({
      ts: new Date(ms).toISOString(),
      parent: value,
      childrenSum: sum,
      remainder: allotted,
      gap,
      gapPercent: gap === null || value === 0 ? null : (100 * gap) / value,
    });
  }
  const compared = hours.filter((h) => h.gapPercent !== null);
  let maxAt: CoherenceHour | null = null;
  for (const hour of compared) if (!maxAt || Math.abs(hour.gapPercent!) > Math.abs(maxAt.gapPercent!)) maxAt = hour;
  const everyChild = children.every((c) => versionOf.has(c.id));
  return {
    parent,
    state,
    parentVersionId: parentVersion?.id ?? null,
    children: children.map((series) => ({ series, versionId: versionOf.get(series.id)?.id ?? null })),
    reconciliation: reconciliation
      ? {
          id: reconciliation.id,
          method: reconciliation.method as 'bottom-up' | 'top-down' | 'min-trace',
          createdAt: reconciliation.createdAt.toISOString(),
          wholeSet,
        }
      : null,
    hours,
    summary: {
      hoursCompared: compared.length,
      meanAbsGapPercent: compared.length ? compared.reduce((acc, h) => acc + Math.abs(h.gapPercent!), 0) / compared.length : null,
      maxAbsGapPercent: maxAt ? Math.abs(maxAt.gapPercent!) : null,
      maxGapAt: maxAt?.ts ?? null,
      coherent:
        everyChild &&
        parentVersion !== null &&
        compared.length === hours.length &&
        compared.every((h) => Math.abs(h.gap!) <= coherentShare * Math.abs(h.parent)),
    },
    notes,
  };
}
