/**
 * Reconciling a hierarchy as a planner: from the current drafts of a parent and every series under it, one
 * coherent set of new drafts (bottom-up, top-down by historical proportions, or minimum trace), written in one
 * transaction, with the unmetered load and losses under each parent carried as an explicit remainder.
 *
 * What goes in, per series (all converted to the root's unit for the sums, back to each series' unit after):
 * - base forecasts: the draft's adjusted means and the model's standard errors over the hours every draft
 *   covers;
 * - history: the last 28 days of actuals before the common origin, hours where every series has one;
 * - remainder under a parent = parent − Σ children in that history; kept when its mean is at least 0.1 % of
 *   the parent's (below that the children meter the parent). Its base forecast is its hour-of-week mean over
 *   the history, its standard error the spread around that mean;
 * - errors for min-trace: the base models' in-sample residuals are not stored, so the correlations of the
 *   errors come from a weekly seasonal-naive benchmark (y_t − y_{t−168}) over the history, shrunk
 *   (Schäfer–Strimmer), and each series' scale from its own draft (the mean standard error over the horizon):
 *   W = diag(s) R* diag(s). The paper's W uses the base models' own one-step residuals; this keeps their
 *   scales and borrows the cross-series correlation from the benchmark.
 */
import type { ForecastSeries, ReconcileRequest, ReconciliationResult } from '@loadwright/contracts';
import { recordAudit } from '@loadwright/audit';
import { forecastPoints, forecastReconciliations, forecastVersions, type Database } from '@loadwright/db';
import { reconcileForecasts, summingStructure, type HierarchyNode } from '@loadwright/forecasting';
import { HttpProblem } from '@loadwright/problems';
import { and, eq, inArray, sql } from 'drizzle-orm';
import type { Caller } from './forecast-adjustments';
import { actualsBetween, adjustmentsOf, currentVersions, findSeries, pointsOf, seriesInScope, type Reader } from './forecast-repository';
import { effectiveValues } from './forecast-review';
import { unitScale } from './unit-scale';

const hourMs = 3_600_000;
const weekHours = 168;
/** Days of actuals the proportions, remainders and error correlations are taken from. */
export const reconciliationHistoryDays = 28;
/** A remainder whose historical mean is below this share of its parent is left out (the children meter it). */
const remainderShareFloor = 0.001;
/** z-values of the central 80 % and 95 % normal intervals (R: qnorm(0.9), qnorm(0.975)). */
const z80 = 1.2815515655446004;
const z95 = 1.959963984540054;

/** Everything the engine needs, aligned with the summing structure's keys. */
export interface HierarchyInputs {
  root: ForecastSeries;
  /** Series of the hierarchy by key (remainders have none). */
  seriesByKey: Map<string, ForecastSeries>;
  nodes: HierarchyNode[];
  draftOf: Map<number, number>;
  /** First common hour and number of common hours. */
  origin: Date;
  horizonHours: number;
  /** Base mean and standard error per node key, in the root's unit. */
  mean: Map<string, Float64Array>;
  se: Map<string, Float64Array>;
  /** Aligned history per node key, in the root's unit (hours where every series has an actual). */
  history: Map<string, Float64Array>;
  /** The instants (epoch ms) of the aligned history hours, ascending. */
  historyMs: number[];
  adjustedDrafts: number;
}

/** Reads the drafts and actuals of a parent's hierarchy; a problem when something needed is missing. */
export async function hierarchyInputs(db: Reader, rootId: number): Promise<HierarchyInputs> {
  const root = await findSeries(db, rootId);
  if (!root || root.level === null) throw new HttpProblem('notFound', `No load series with id ${rootId}.`);
  const members = await seriesInScope(db, { kind: 'subtree', rootId: root.id });
  if (members.length < 2) {
    throw new HttpProblem('conflict', `${root.name} (${root.key}) has no series under it: there is nothing to reconcile.`);
  }
  const drafts = (
    await currentVersions(
      db,
      members.map((m) => m.id),
    )
  ).filter((v) => v.state === 'draft');
  const draftBySeries = new Map(drafts.map((d) => [d.seriesId, d]));
  const missing = members.filter((m) => !draftBySeries.has(m.id));
  if (missing.length > 0) {
    throw new HttpProblem(
      'conflict',
      `${missing.length} series under ${root.key} have no draft to reconcile. Refit them first.`,
      missing.map((m) => ({ pointer: `/series/${m.id}`, detail: `${m.name} (${m.key}) has no draft.` })),
    );
  }
  const origin = Math.max(...drafts.map((d) => d.origin.getTime()));
  const end = Math.min(...drafts.map((d) => d.origin.getTime() + d.horizonHours * hourMs));
  const horizonHours = Math.floor((end - origin) / hourMs);
  if (horizonHours < 24) {
    throw new HttpProblem(
      'conflict',
      `The drafts under ${root.key} share only ${Math.max(0, horizonHours)} hours; refit them together first.`,
    );
  }
  const ids = drafts.map((d) => d.id);
  const [points, adjustments] = await Promise.all([pointsOf(db, ids), adjustmentsOf(db, ids)]);
  const mean = new Map<string, Float64Array>();
  const se = new Map<string, Float64Array>();
  const history = new Map<string, Map<number, number>>();
  const from = new Date(origin - reconciliationHistoryDays * 24 * hourMs);
  for (const member of members) {
    const draft = draftBySeries.get(member.id)!;
    const scale = unitScale(member.unit, root.unit);
    const rows = points.get(draft.id)!;
    const values = effectiveValues(rows, adjustments.get(draft.id)!);
    const m = new Float64Array(horizonHours);
    const s = new Float64Array(horizonHours);
    rows.forEach((row, i) => {
      const h = Math.round((row.ts.getTime() - origin) / hourMs);
      if (h < 0 || h >= horizonHours) return;
      m[h] = values[i]!.value * scale;
      s[h] = row.stdError * scale;
    });
    mean.set(member.key, m);
    se.set(member.key, s);
    const actuals = await actualsBetween(db, member.id, from, new Date(origin));
    history.set(member.key, new Map(actuals.map((a) => [a.ts.getTime(), a.value * scale])));
  }
  const historyMs = [...history.get(root.key)!.keys()]
    .filter((ms) => members.every((m) => history.get(m.key)!.has(ms)))
    .sort((a, b) => a - b);
  if (historyMs.length < 2 * weekHours) {
    throw new HttpProblem(
      'conflict',
      `Reconciling ${root.key} needs at least two weeks of hours in the last ${reconciliationHistoryDays} days where every series under it has an actual; found ${historyMs.length} hours.`,
    );
  }
  const aligned = new Map([...history].map(([key, byMs]) => [key, Float64Array.from(historyMs, (ms) => byMs.get(ms)!)]));
  const nodes: HierarchyNode[] = members.map((m) => ({
    key: m.key,
    parentKey: m.id === root.id ? null : members.find((p) => p.id === m.parentId)!.key,
  }));
  for (const node of nodes) {
    const children = nodes.filter((c) => c.parentKey === node.key);
    if (children.length === 0) continue;
    const parentHistory = aligned.get(node.key)!;
    let remainderSum = 0;
    let parentSum = 0;
    for (let t = 0; t < historyMs.length; t++) {
      const covered = children.reduce((acc, c) => acc + aligned.get(c.key)![t]!, 0);
      remainderSum += parentHistory[t]! - covered;
      parentSum += parentHistory[t]!;
    }
    node.remainder = Math.abs(remainderSum) >= remainderShareFloor * Math.abs(parentSum);
  }
  return {
    root,
    seriesByKey: new Map(members.map((m) => [m.key, m])),
    nodes,
    draftOf: new Map(drafts.map((d) => [d.seriesId, d.id])),
    origin: new Date(origin),
    horizonHours,
    mean,
    se,
    history: aligned,
    historyMs,
    adjustedDrafts: drafts.filter((d) => d.adjustmentCount > 0).length,
  };
}

/** Hour-of-week slot of an instant counted in whole hours from the origin (weeks of 168 hours). */
function weekSlot(ms: number, originMs: number): number {
  const hours = Math.round((ms - originMs) / hourMs);
  return ((hours % weekHours) + weekHours) % weekHours;
}

/** Base forecast of a remainder: its hour-of-week mean over the history, and the spread around it. */
function remainderForecast(values: Float64Array, historyMs: number[], originMs: number, horizonHours: number) {
  const sums = new Float64Array(weekHours);
  const counts = new Float64Array(weekHours);
  historyMs.forEach((ms, t) => {
    const slot = weekSlot(ms, originMs);
    sums[slot]! += values[t]!;
    counts[slot]! += 1;
  });
  let overall = 0;
  for (const v of values) overall += v;
  overall /= values.length;
  const profile = Float64Array.from(sums, (s, k) => (counts[k]! > 0 ? s / counts[k]! : overall));
  let squares = 0;
  historyMs.forEach((ms, t) => (squares += (values[t]! - profile[weekSlot(ms, originMs)]!) ** 2));
  // The spread of a remainder can be zero when it is a constant share; keep a floor so W stays invertible.
  const spread = Math.max(Math.sqrt(squares / Math.max(1, values.length - 1)), 1e-6 * Math.abs(overall), 1e-9);
  const mean = Float64Array.from({ length: horizonHours }, (_, h) => profile[h % weekHours]!);
  return { mean, se: new Float64Array(horizonHours).fill(spread) };
}

/** Weekly seasonal-naive errors y_t − y_{t−168} over the aligned history (hours whose week-earlier hour is there). */
function benchmarkErrors(values: Float64Array, historyMs: number[]): number[] {
  const index = new Map(historyMs.map((ms, t) => [ms, t]));
  const errors: number[] = [];
  historyMs.forEach((ms, t) => {
    const earlier = index.get(ms - weekHours * hourMs);
    if (earlier !== undefined) errors.push(values[t]! - values[earlier]!);
  });
  return errors;
}

/** The reconciled set before it is written: per key, mean and standard error in the root's unit. */
export interface ReconciledSet {
  keys: string[];
  remainderOf: Map<string, string>;
  mean: Map<string, Float64Array>;
  se: Map<string, Float64Array>;
  shrinkage: number | null;
}

/** Reconciles the inputs by `method` (pure computation; nothing is written). */
export function reconcileInputs(inputs: HierarchyInputs, method: ReconcileRequest['method']): ReconciledSet {
  const structure = summingStructure(inputs.nodes);
  const originMs = inputs.origin.getTime();
  const history = new Map(inputs.history);
  const mean = new Map(inputs.mean);
  const se = new Map(inputs.se);
  for (const [remainder, parent] of structure.remainderOf) {
    const children = structure.childrenOf.get(parent)!.filter((k) => k !== remainder);
    const values = Float64Array.from(history.get(parent)!, (v, t) => v - children.reduce((acc, c) => acc + history.get(c)![t]!, 0));
    history.set(remainder, values);
    const base = remainderForecast(values, inputs.historyMs, originMs, inputs.horizonHours);
    mean.set(remainder, base.mean);
    se.set(remainder, base.se);
  }
  const errors = structure.keys.map((k) => benchmarkErrors(history.get(k)!, inputs.historyMs));
  const errorScale = structure.keys.map((k) => {
    const s = se.get(k)!;
    const average = s.reduce((acc, v) => acc + v, 0) / s.length;
    return average > 0 ? average : 1e-9;
  });
  const result = reconcileForecasts(
    structure,
    {
      mean: structure.keys.map((k) => mean.get(k)!),
      se: structure.keys.map((k) => se.get(k)!),
      errors,
      errorScale,
      history: structure.keys.map((k) => history.get(k)!),
    },
    method,
  );
  return {
    keys: structure.keys,
    remainderOf: structure.remainderOf,
    mean: new Map(structure.keys.map((k, i) => [k, result.mean[i]!])),
    se: new Map(structure.keys.map((k, i) => [k, result.se[i]!])),
    shrinkage: method === 'min-trace' ? result.lambda : null,
  };
}

/** Reconciles the current drafts under `rootId` and writes the coherent set; see the file comment. */
export async function reconcileHierarchy(
  db: Database,
  rootId: number,
  request: ReconcileRequest,
  { actor, ip }: Caller,
): Promise<ReconciliationResult> {
  const inputs = await hierarchyInputs(db, rootId);
  const set = reconcileInputs(inputs, request.method);
  const members = [...inputs.seriesByKey.values()];
  return db.transaction(async (tx) => {
    // Lock the series in id order (as approvals do), then make sure no refit or approval replaced a draft meanwhile.
    const ids = members.map((m) => m.id).sort((a, b) => a - b);
    await tx.execute(
      sql`select id from series where id in (${sql.join(
        ids.map((id) => sql`${id}`),
        sql`, `,
      )}) order by id for no key update`,
    );
    const current = await tx
      .select({ id: forecastVersions.id, seriesId: forecastVersions.seriesId })
      .from(forecastVersions)
      .where(and(inArray(forecastVersions.seriesId, ids), eq(forecastVersions.state, 'draft')));
    const changed = members.filter((m) => current.find((c) => c.seriesId === m.id)?.id !== inputs.draftOf.get(m.id));
    if (changed.length > 0) {
      throw new HttpProblem(
        'conflict',
        `The drafts of ${changed.map((m) => m.key).join(', ')} changed while reconciling; nothing was written. Reconcile again.`,
      );
    }
    const oldDrafts = await tx
      .select()
      .from(forecastVersions)
      .where(inArray(forecastVersions.id, [...inputs.draftOf.values()]));
    const supersededAt = new Date();
    await tx
      .update(forecastVersions)
      .set({ state: 'superseded', supersededAt })
      .where(inArray(forecastVersions.id, [...inputs.draftOf.values()]));
    const versions: ReconciliationResult['versions'] = [];
    const methodWords = { 'bottom-up': 'bottom-up', 'top-down': 'top-down by historical proportions', 'min-trace': 'minimum trace' };
    for (const member of members) {
      const old = oldDrafts.find((d) => d.seriesId === member.id)!;
      const note = {
        code: 'reconciled',
        message:
          `Reconciled ${methodWords[request.method]} across ${inputs.root.key} from draft ${old.id}` +
          (inputs.adjustedDrafts > 0 ? ', adjusted numbers included.' : '.'),
      };
      const [version] = await tx
        .insert(forecastVersions)
        .values({
          seriesId: member.id,
          fitId: old.fitId,
          refitRunId: null,
          origin: inputs.origin,
          horizonHours: inputs.horizonHours,
          levels: [80, 95],
          warnings: [...old.warnings.filter((w) => w.code !== 'reconciled'), note],
        })
        .returning({ id: forecastVersions.id });
      const back = unitScale(inputs.root.unit, member.unit);
      const m = set.mean.get(member.key)!;
      const s = set.se.get(member.key)!;
      await tx.insert(forecastPoints).values(
        Array.from({ length: inputs.horizonHours }, (_, h) => {
          const mean = m[h]! * back;
          const se = s[h]! * back;
          return {
            versionId: version!.id,
            ts: new Date(inputs.origin.getTime() + h * hourMs),
            mean,
            stdError: se,
            lower80: mean - z80 * se,
            upper80: mean + z80 * se,
            lower95: mean - z95 * se,
            upper95: mean + z95 * se,
          };
        }),
      );
      versions.push({ seriesId: member.id, key: member.key, versionId: version!.id, replacedVersionId: old.id });
    }
    const remainders = [...set.remainderOf].map(([remainderKey, parentKey]) => {
      const parent = inputs.seriesByKey.get(parentKey)!;
      const back = unitScale(inputs.root.unit, parent.unit);
      return { parent, mean: Array.from(set.mean.get(remainderKey)!, (v) => v * back), parentMean: set.mean.get(parentKey)! };
    });
    const [row] = await tx
      .insert(forecastReconciliations)
      .values({
        rootSeriesId: inputs.root.id,
        method: request.method,
        shrinkage: set.shrinkage,
        origin: inputs.origin,
        horizonHours: inputs.horizonHours,
        versionIds: versions.map((v) => v.versionId),
        remainders: remainders.map((r) => ({ parentSeriesId: r.parent.id, mean: r.mean })),
        createdById: actor.kind === 'user' ? actor.userId : null,
      })
      .returning({ id: forecastReconciliations.id });
    await recordAudit(tx, {
      actor,
      action: 'forecast.reconciled',
      targetType: 'series',
      targetId: inputs.root.id,
      detail: { reconciliationId: row!.id, method: request.method, versions: versions.length },
      ip,
    });
    return {
      id: row!.id,
      rootSeriesId: inputs.root.id,
      method: request.method,
      shrinkage: set.shrinkage,
      origin: inputs.origin.toISOString(),
      horizonHours: inputs.horizonHours,
      versions,
      remainders: remainders.map((r) => {
        const back = unitScale(inputs.root.unit, r.parent.unit);
        const remainderTotal = r.mean.reduce((acc, v) => acc + v, 0);
        const parentTotal = r.parentMean.reduce((acc, v) => acc + v * back, 0);
        return {
          parentSeriesId: r.parent.id,
          key: r.parent.key,
          meanSharePercent: parentTotal === 0 ? 0 : (100 * remainderTotal) / parentTotal,
        };
      }),
    };
  });
}
