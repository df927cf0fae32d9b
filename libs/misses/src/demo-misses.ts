/**
 * A few realistic misses in the demo utility's history, made the way production makes them: for a
 * handful of series, the week before the history ends is "forecast" with the same hour of the week
 * before (seasonal naive) and a 95 % band from that forecast's own recent errors — an approved
 * version for the last week and the draft written on its last morning — and detection then judges
 * the actuals against them with the default rules. One miss is acknowledged with a planner's
 * comment and one resolved, so every state shows.
 */
import { and, asc, eq, gte, inArray, lt, sql } from 'drizzle-orm';
import {
  fits,
  forecastPoints,
  forecastVersions,
  missComments,
  missEvents,
  observations,
  series,
  users,
  type Database,
} from '@loadwright/db';
import { detectMisses } from './detect-misses';
import { hourMs } from './hour-point';
import { ensureDefaultRules } from './miss-repository';

/** Series that get demo forecasts: the system, one zone and one feeder. */
export const demoMissSeries = ['sys', 'zone-north', 'fdr-c3'] as const;

const z95 = 1.959963984540054;
const week = 168;

/** Writes one version from seasonal-naive means over [origin, origin + hours); returns its id. */
async function naiveVersion(
  tx: Pick<Database, 'insert' | 'update'>,
  seriesId: number,
  values: Map<number, number>,
  origin: number,
  hours: number,
  issuedAt: Date,
  state: { state: 'draft' | 'superseded'; approvedAt: Date | null; supersededAt: Date | null },
): Promise<number> {
  // Standard error: RMS of the seasonal-naive error over the two weeks before the origin.
  let sum = 0;
  let n = 0;
  for (let t = origin - 2 * week * hourMs; t < origin; t += hourMs) {
    const a = values.get(t);
    const f = values.get(t - week * hourMs);
    if (a === undefined || f === undefined) continue;
    sum += (a - f) ** 2;
    n++;
  }
  const se = Math.sqrt(sum / Math.max(1, n));
  const [fit] = await tx
    .insert(fits)
    .values({
      seriesId,
      specSnapshot: { method: 'seasonal-naive' },
      method: 'seasonal_naive',
      arOrder: 0,
      maOrder: 0,
      parameters: { seasonalNaive: { period: week } },
      sigma2: se * se,
      dataStart: new Date(origin - 8 * week * hourMs),
      dataEnd: new Date(origin - hourMs),
      observationCount: 8 * week,
      dataHash: `demo-${seriesId}-${origin}`,
      durationMs: 4,
      // The model card reads these checks from every fit; seasonal naive has no residual model to check.
      diagnostics: {
        residualAcf: [],
        acfBand: 0,
        ljungBox: null,
        temperature: { used: false, reason: 'the chosen model (seasonal naive) uses no regressors' },
        warnings: [],
      },
    })
    .returning({ id: fits.id });
  const [version] = await tx
    .insert(forecastVersions)
    .values({ seriesId, fitId: fit!.id, origin: new Date(origin), horizonHours: hours, issuedAt })
    .returning({ id: forecastVersions.id });
  const points = [];
  for (let i = 0; i < hours; i++) {
    const ts = origin + i * hourMs;
    const mean = values.get(ts - week * hourMs);
    if (mean === undefined) continue;
    points.push({
      versionId: version!.id,
      ts: new Date(ts),
      mean,
      stdError: se,
      lower80: mean - 1.2815515655446004 * se,
      upper80: mean + 1.2815515655446004 * se,
      lower95: mean - z95 * se,
      upper95: mean + z95 * se,
    });
  }
  await tx.insert(forecastPoints).values(points);
  // Points are written while the version is a draft (a superseded version's points are frozen), then
  // it goes through approval to superseded as a planner's would.
  if (state.approvedAt) {
    await tx.update(forecastVersions).set({ state: 'approved', approvedAt: state.approvedAt }).where(eq(forecastVersions.id, version!.id));
    if (state.supersededAt)
      await tx
        .update(forecastVersions)
        .set({ state: 'superseded', supersededAt: state.supersededAt })
        .where(eq(forecastVersions.id, version!.id));
  }
  return version!.id;
}

/**
 * Adds the demo misses when the demo's series exist and none of them has a forecast yet (so it runs
 * once, right after the demo is seeded). Returns the number of misses found.
 */
export async function seedDemoMisses(db: Database): Promise<number> {
  const rows = await db
    .select({ id: series.id, key: series.key })
    .from(series)
    .where(inArray(series.key, [...demoMissSeries]));
  if (rows.length === 0) return 0;
  const ids = rows.map((row) => row.id);
  const [existing] = await db
    .select({ id: forecastVersions.id })
    .from(forecastVersions)
    .where(inArray(forecastVersions.seriesId, ids))
    .limit(1);
  if (existing) return 0;
  await ensureDefaultRules(db);
  const [last] = await db
    .select({ ts: sql<string>`max(${observations.ts})` })
    .from(observations)
    .where(inArray(observations.seriesId, ids));
  if (!last?.ts) return 0;
  const end = Date.parse(new Date(last.ts).toISOString()) + hourMs;
  // The approved version covers the last full week but one day; the draft was written that last morning.
  const draftOrigin = end - 18 * hourMs;
  const approvedOrigin = draftOrigin - week * hourMs;
  await db.transaction(async (tx) => {
    for (const row of rows) {
      const readings = await tx
        .select({ ts: observations.ts, value: observations.value, estimated: observations.estimated })
        .from(observations)
        .where(
          and(
            eq(observations.seriesId, row.id),
            gte(observations.ts, new Date(approvedOrigin - 3 * week * hourMs)),
            lt(observations.ts, new Date(end)),
          ),
        )
        .orderBy(asc(observations.ts));
      const values = new Map<number, number>();
      for (const r of readings) {
        const v = r.estimated ?? r.value;
        if (v !== null) values.set(r.ts.getTime(), v);
      }
      await naiveVersion(tx, row.id, values, approvedOrigin, week, new Date(approvedOrigin - 3 * hourMs), {
        state: 'superseded',
        approvedAt: new Date(approvedOrigin + 2 * hourMs),
        supersededAt: new Date(draftOrigin + 3 * hourMs),
      });
      await naiveVersion(tx, row.id, values, draftOrigin, week, new Date(draftOrigin - 4 * hourMs), {
        state: 'draft',
        approvedAt: null,
        supersededAt: null,
      });
    }
  });
  const now = new Date(end);
  const opened: number[] = [];
  for (const id of ids) opened.push(...(await detectMisses(db, id, now)).opened);
  if (opened.length === 0) return 0;
  const people = await db.select({ id: users.id, role: users.role }).from(users);
  const planner = people.find((p) => p.role === 'planner')?.id ?? null;
  const admin = people.find((p) => p.role === 'admin')?.id ?? null;
  const events = await db.select().from(missEvents).where(inArray(missEvents.id, opened)).orderBy(asc(missEvents.periodStart));
  const acknowledged = events.find((e) => e.severity !== 'high') ?? events[0]!;
  const resolved = events.find((e) => e.id !== acknowledged.id && e.severity !== 'high');
  const at = new Date(end - hourMs);
  await db
    .update(missEvents)
    .set({ state: 'acknowledged', acknowledgedAt: at, acknowledgedById: planner, notifiedAt: at })
    .where(eq(missEvents.id, acknowledged.id));
  await db.insert(missComments).values({
    eventId: acknowledged.id,
    authorId: planner,
    body: 'Seen. Last week repeated a cold snap that did not come back; watching tomorrow before changing the model settings.',
  });
  if (resolved) {
    await db
      .update(missEvents)
      .set({ state: 'resolved', acknowledgedAt: at, acknowledgedById: admin, resolvedAt: at, resolvedById: admin, notifiedAt: at })
      .where(eq(missEvents.id, resolved.id));
    await db
      .insert(missComments)
      .values({ eventId: resolved.id, authorId: admin, body: 'Estimates checked with the steward; readings corrected upstream.' });
  }
  // Demo history is past: nothing in it is news to e-mail.
  await db.update(missEvents).set({ notifiedAt: at, detectedAt: at }).where(inArray(missEvents.id, opened));
  return opened.length;
}
