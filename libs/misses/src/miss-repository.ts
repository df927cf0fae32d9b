/**
 * Reading what detection needs from the database (rules, the organisation's clock, a series' hourly
 * actual-against-forecast points) and writing what it finds as miss events.
 */
import { and, asc, desc, eq, gte, inArray, isNotNull, isNull, lt, or, sql } from 'drizzle-orm';
import { forecastVersions, missEvents, missRules, observations, organisation, series, type Database } from '@loadwright/db';
import { adjustPoints, adjustmentsOf, pointsOf } from '@loadwright/forecasts';
import { hourMs, type EvidenceHour, type HourPoint, type MissHit } from './hour-point';
import { defaultRules, type LoadUnit } from './rule-kinds';
import type { ScopedRule } from './rules-in-force';
import { versionInForce } from './version-in-force';

/** A database or transaction. */
export type MissDb = Pick<Database, 'select' | 'insert' | 'update' | 'execute'>;

/** A stored rule with what evaluation and mail need. */
export type StoredRule = ScopedRule;

/** Every rule, active or not, except overrides a planner removed. */
export async function loadRules(db: MissDb): Promise<StoredRule[]> {
  return db.select().from(missRules).where(isNull(missRules.removedAt)).orderBy(asc(missRules.id));
}

/**
 * Writes the default rules (scope all) when there are no default rules at all, so a new installation
 * detects misses from its first actuals. Serialised by an advisory lock so two workers add one set.
 */
export async function ensureDefaultRules(db: Pick<Database, 'transaction'>): Promise<void> {
  await db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext('loadwright:miss-default-rules'))`);
    const [existing] = await tx.select({ id: missRules.id }).from(missRules).where(eq(missRules.scope, 'all')).limit(1);
    if (existing) return;
    await tx.insert(missRules).values(
      defaultRules.map((rule) => ({
        name: defaultRuleName(rule.kind),
        scope: 'all' as const,
        kind: rule.kind,
        hours: rule.hours,
        threshold: rule.threshold,
        bandLevel: rule.bandLevel,
        floorKw: rule.floorKw,
        peakHourTolerance: rule.peakHourTolerance,
        severity: rule.severity,
        recipients: ['role:admin', 'role:planner'],
      })),
    );
  });
}

function defaultRuleName(kind: string): string {
  return `Default: ${kind.replaceAll('_', ' ')}`;
}

/** The organisation's time zone and morning deadline (UTC and 07:00 before one is set up). */
export async function organisationClock(db: MissDb): Promise<{ timeZone: string; forecastDeadlineMinute: number }> {
  const [row] = await db
    .select({ timeZone: organisation.timeZone, forecastDeadlineMinute: organisation.forecastDeadlineMinute })
    .from(organisation)
    .limit(1);
  return row ?? { timeZone: 'UTC', forecastDeadlineMinute: 420 };
}

/** A load series as detection sees it. */
export interface WatchedSeries {
  id: number;
  key: string;
  name: string;
  level: string | null;
  unit: LoadUnit;
  timeZone: string;
  intervalMinutes: number;
}

/** Active load series, all of them or the ones listed. */
export async function watchedSeries(db: MissDb, ids?: number[]): Promise<WatchedSeries[]> {
  const rows = await db
    .select({
      id: series.id,
      key: series.key,
      name: series.name,
      level: series.level,
      unit: series.unit,
      timeZone: series.timeZone,
      intervalMinutes: series.intervalMinutes,
      archivedAt: series.archivedAt,
      kind: series.kind,
    })
    .from(series)
    .where(ids ? inArray(series.id, ids) : undefined)
    .orderBy(asc(series.id));
  return rows
    .filter((row) => row.kind === 'load' && row.archivedAt === null && row.intervalMinutes <= 60)
    .map(({ archivedAt: _a, kind: _k, unit, ...row }) => ({ ...row, unit: unit as LoadUnit }));
}

/**
 * The hourly points of a series over [from, to): each hour's mean actual (the estimate where a reading
 * was replaced; null unless every interval of the hour arrived) and the forecast in force for it after
 * planners' adjustments. Hours are those of the forecasts (their instants), else UTC hours.
 */
export async function hourPointsOf(db: MissDb, watched: WatchedSeries, from: Date, to: Date): Promise<HourPoint[]> {
  const versions = await db
    .select({
      id: forecastVersions.id,
      origin: forecastVersions.origin,
      horizonHours: forecastVersions.horizonHours,
      approvedAt: forecastVersions.approvedAt,
    })
    .from(forecastVersions)
    .where(
      and(
        eq(forecastVersions.seriesId, watched.id),
        lt(forecastVersions.origin, to),
        sql`${forecastVersions.origin} + make_interval(hours => ${forecastVersions.horizonHours}) > ${from.toISOString()}::timestamptz`,
      ),
    );
  const ids = versions.map((v) => v.id);
  const [points, adjustments] = await Promise.all([pointsOf(db, ids), adjustmentsOf(db, ids)]);
  const forecastAt = new Map<number, Map<number, Omit<HourPoint, 'actual' | 'estimated' | 'ts'>>>();
  for (const version of versions) {
    const own = points.get(version.id) ?? [];
    const adjusted = adjustPoints(own, adjustments.get(version.id) ?? []);
    const byTs = new Map<number, Omit<HourPoint, 'actual' | 'estimated' | 'ts'>>();
    own.forEach((point, i) => {
      const band = adjusted[i] ?? point;
      byTs.set(point.ts.getTime(), {
        forecast: band.mean,
        stdError: point.stdError,
        lower80: band.lower80,
        upper80: band.upper80,
        lower95: band.lower95,
        upper95: band.upper95,
        versionId: version.id,
      });
    });
    forecastAt.set(version.id, byTs);
  }
  const readings = await db
    .select({ ts: observations.ts, value: observations.value, estimated: observations.estimated })
    .from(observations)
    .where(and(eq(observations.seriesId, watched.id), gte(observations.ts, from), lt(observations.ts, to)))
    .orderBy(asc(observations.ts));
  // Anchor hours on a forecast instant so that series in half-hour zones bucket like their forecasts.
  const anchor = points.values().next().value?.[0]?.ts.getTime() ?? 0;
  const hourOf = (t: number) => anchor + Math.floor((t - anchor) / hourMs) * hourMs;
  const perHour = 60 / watched.intervalMinutes;
  const buckets = new Map<number, { sum: number; n: number; estimated: boolean }>();
  for (const reading of readings) {
    const value = reading.estimated ?? reading.value;
    if (value === null) continue;
    const hour = hourOf(reading.ts.getTime());
    const bucket = buckets.get(hour) ?? { sum: 0, n: 0, estimated: false };
    bucket.sum += value;
    bucket.n++;
    bucket.estimated ||= reading.estimated !== null;
    buckets.set(hour, bucket);
  }
  const hours = new Set<number>(buckets.keys());
  for (const byTs of forecastAt.values()) for (const t of byTs.keys()) if (t >= from.getTime() && t < to.getTime()) hours.add(t);
  return [...hours]
    .sort((a, b) => a - b)
    .map((t) => {
      const ts = new Date(t);
      const version = versionInForce(versions, ts);
      const forecast = version ? forecastAt.get(version.id)?.get(t) : undefined;
      const bucket = buckets.get(t);
      return {
        ts,
        actual: bucket && bucket.n >= perHour ? bucket.sum / bucket.n : null,
        estimated: bucket?.estimated ?? false,
        forecast: forecast?.forecast ?? null,
        stdError: forecast?.stdError ?? null,
        lower80: forecast?.lower80 ?? null,
        upper80: forecast?.upper80 ?? null,
        lower95: forecast?.lower95 ?? null,
        upper95: forecast?.upper95 ?? null,
        versionId: forecast?.versionId ?? null,
      };
    });
}

/** The newest actual's instant and the newest version's issue time of a series. */
export async function seriesFreshness(db: MissDb, seriesId: number): Promise<{ lastActualTs: Date | null; latestIssuedAt: Date | null }> {
  const [actual] = await db
    .select({ ts: observations.ts })
    .from(observations)
    .where(and(eq(observations.seriesId, seriesId), or(isNotNull(observations.value), isNotNull(observations.estimated))))
    .orderBy(desc(observations.ts))
    .limit(1);
  const [version] = await db
    .select({ issuedAt: forecastVersions.issuedAt })
    .from(forecastVersions)
    .where(eq(forecastVersions.seriesId, seriesId))
    .orderBy(desc(forecastVersions.issuedAt))
    .limit(1);
  return { lastActualTs: actual?.ts ?? null, latestIssuedAt: version?.issuedAt ?? null };
}

/** What recording hits did to the events of one rule and series. */
export interface RecordOutcome {
  opened: number[];
  extended: number[];
  unchanged: number;
}

/** The evidence and numbers an event keeps. */
export interface EventDetail extends Record<string, unknown> {
  summary: string;
  measures: Record<string, number>;
  hours: EvidenceHour[];
}

/**
 * Records a rule's hits for one series: a hit inside an event's period adds nothing; a hit touching
 * or overlapping an unresolved event, or any hit while the rule and series have an open event,
 * extends that event (period and evidence); a hit after a resolved event opens a new one for the hours
 * after it; otherwise a new open event starts. Runs under a per-(rule, series) advisory lock, so
 * concurrent detections never write two events for one miss.
 */
export async function recordHits(
  db: Pick<Database, 'transaction'>,
  rule: StoredRule,
  seriesId: number,
  hits: readonly MissHit[],
): Promise<RecordOutcome> {
  const outcome: RecordOutcome = { opened: [], extended: [], unchanged: 0 };
  if (hits.length === 0) return outcome;
  await db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(${rule.id}, ${seriesId})`);
    for (const hit of [...hits].sort((a, b) => a.start.getTime() - b.start.getTime())) {
      const events = await tx
        .select()
        .from(missEvents)
        .where(
          and(
            eq(missEvents.ruleId, rule.id),
            eq(missEvents.seriesId, seriesId),
            sql`${missEvents.periodEnd} >= ${hit.start.toISOString()}::timestamptz - interval '1 day'`,
          ),
        )
        .orderBy(asc(missEvents.periodStart));
      if (events.some((event) => event.periodStart <= hit.start && event.periodEnd >= hit.end)) {
        outcome.unchanged++;
        continue;
      }
      const touching = events.find((event) => event.state !== 'resolved' && event.periodStart <= hit.end && event.periodEnd >= hit.start);
      const open = events.find((event) => event.state === 'open') ?? (await openEventOf(tx, rule.id, seriesId));
      const target = touching ?? open;
      if (target) {
        const detail = target.detail as EventDetail;
        const hours = new Map((detail.hours ?? []).map((hour) => [hour.ts, hour]));
        for (const hour of hit.evidence) hours.set(hour.ts, hour);
        await tx
          .update(missEvents)
          .set({
            periodStart: hit.start < target.periodStart ? hit.start : target.periodStart,
            periodEnd: hit.end > target.periodEnd ? hit.end : target.periodEnd,
            detail: { summary: hit.summary, measures: hit.measures, hours: [...hours.values()].sort((a, b) => a.ts.localeCompare(b.ts)) },
          })
          .where(eq(missEvents.id, target.id));
        outcome.extended.push(target.id);
        continue;
      }
      // After a resolved event only the hours past it are new.
      const resolvedEnd = events.filter((event) => event.state === 'resolved' && event.periodEnd > hit.start).at(-1)?.periodEnd;
      const start = resolvedEnd && resolvedEnd > hit.start ? resolvedEnd : hit.start;
      const evidence = hit.evidence.filter((hour) => new Date(hour.ts) >= start);
      const [row] = await tx
        .insert(missEvents)
        .values({
          ruleId: rule.id,
          seriesId,
          versionId: evidence.find((hour) => hour.versionId !== null)?.versionId ?? null,
          severity: rule.severity,
          periodStart: start,
          periodEnd: hit.end,
          detail: { summary: hit.summary, measures: hit.measures, hours: evidence },
        })
        .onConflictDoNothing()
        .returning({ id: missEvents.id });
      if (row) outcome.opened.push(row.id);
      else outcome.unchanged++;
    }
  });
  return outcome;
}

async function openEventOf(tx: MissDb, ruleId: number, seriesId: number) {
  const [row] = await tx
    .select()
    .from(missEvents)
    .where(and(eq(missEvents.ruleId, ruleId), eq(missEvents.seriesId, seriesId), eq(missEvents.state, 'open')))
    .limit(1);
  return row;
}
