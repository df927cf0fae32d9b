/**
 * Detection for one series: the rules in force judged on the last eight days of hourly actuals
 * against the forecast in force, each hit recorded as a new or extended miss event.
 */
import { missEvents, series, type Database } from '@loadwright/db';
import { and, eq, gt, sql } from 'drizzle-orm';
import { trackingWindowHours } from './creeping-bias';
import { evaluateRule } from './evaluate-rule';
import { explainEvent } from './explain-event';
import { notifyNewMisses } from './notify-misses';
import { hourMs } from './hour-point';
import {
  hourPointsOf,
  loadRules,
  organisationClock,
  recordHits,
  seriesFreshness,
  watchedSeries,
  type RecordOutcome,
} from './miss-repository';
import { rulesInForce } from './rules-in-force';

/** Hours judged: a week for daily peaks, plus a day for late actuals (the tracking signal reads a day more). */
export const detectionWindowHours = 192;

/** What one detection did, by rule id. */
export interface DetectionOutcome {
  seriesId: number;
  opened: number[];
  extended: number[];
  unchanged: number;
}

/**
 * Judges series `seriesId` as of `now` (the clock of the caller; tests pass a fixed one). A series
 * that is not an active load series of hourly or finer readings is skipped (a temperature station's
 * new readings re-explain the misses of the series it serves). With `publicUrl`, new events are
 * e-mailed (links point there).
 */
export async function detectMisses(
  db: Database,
  seriesId: number,
  now: Date = new Date(),
  options: { publicUrl?: string } = {},
): Promise<DetectionOutcome> {
  const outcome: DetectionOutcome = { seriesId, opened: [], extended: [], unchanged: 0 };
  const [watched] = await watchedSeries(db, [seriesId]);
  if (!watched) {
    // New temperatures for a station: misses of the load series it serves can now be split.
    for (const eventId of await eventsServedBy(db, seriesId)) await explainEvent(db, eventId);
    return outcome;
  }
  const rules = rulesInForce(await loadRules(db), watched);
  if (rules.length === 0) return outcome;
  const to = new Date(Math.floor(now.getTime() / hourMs) * hourMs);
  const from = new Date(to.getTime() - detectionWindowHours * hourMs);
  const [points, freshness, clock] = await Promise.all([
    // A day before the window feeds the tracking signal of the window's first hours.
    hourPointsOf(db, watched, new Date(from.getTime() - trackingWindowHours * hourMs), to),
    seriesFreshness(db, seriesId),
    organisationClock(db),
  ]);
  for (const rule of rules) {
    const hits = evaluateRule(rule, {
      points,
      judgeFrom: from,
      series: { unit: watched.unit, timeZone: watched.timeZone, intervalMinutes: watched.intervalMinutes },
      now,
      lastActualTs: freshness.lastActualTs,
      latestIssuedAt: freshness.latestIssuedAt,
      organisation: clock,
    });
    const recorded: RecordOutcome = await recordHits(db, rule, seriesId, hits);
    outcome.opened.push(...recorded.opened);
    outcome.extended.push(...recorded.extended);
    outcome.unchanged += recorded.unchanged;
  }
  // New evidence: explain again (observed temperatures may have arrived since).
  for (const eventId of new Set([...outcome.opened, ...outcome.extended])) await explainEvent(db, eventId);
  // Only new events are e-mailed at once; an event growing is news for the page, not another e-mail.
  if (options.publicUrl) await notifyNewMisses(db, outcome.opened, options.publicUrl);
  return outcome;
}

/** Events of the last two weeks on load series whose temperature station is `stationId`. */
async function eventsServedBy(db: Database, stationId: number): Promise<number[]> {
  const rows = await db
    .select({ id: missEvents.id })
    .from(missEvents)
    .innerJoin(series, eq(series.id, missEvents.seriesId))
    .where(and(eq(series.temperatureSeriesId, stationId), gt(missEvents.detectedAt, sql`now() - interval '14 days'`)));
  return rows.map((row) => row.id);
}
