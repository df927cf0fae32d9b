/**
 * Detection for one series: the rules in force judged on the last eight days of hourly actuals
 * against the forecast in force, each hit recorded as a new or extended miss event.
 */
import type { Database } from '@loadwright/db';
import { evaluateRule } from './evaluate-rule';
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

/** Hours looked back over: a week for the tracking signal and daily peaks, plus a day for late actuals. */
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
 * that is not an active load series of hourly or finer readings is skipped.
 */
export async function detectMisses(db: Database, seriesId: number, now: Date = new Date()): Promise<DetectionOutcome> {
  const outcome: DetectionOutcome = { seriesId, opened: [], extended: [], unchanged: 0 };
  const [watched] = await watchedSeries(db, [seriesId]);
  if (!watched) return outcome;
  const rules = rulesInForce(await loadRules(db), watched);
  if (rules.length === 0) return outcome;
  const to = new Date(Math.floor(now.getTime() / hourMs) * hourMs);
  const from = new Date(to.getTime() - detectionWindowHours * hourMs);
  const [points, freshness, clock] = await Promise.all([
    hourPointsOf(db, watched, from, to),
    seriesFreshness(db, seriesId),
    organisationClock(db),
  ]);
  for (const rule of rules) {
    const hits = evaluateRule(rule, {
      points,
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
  return outcome;
}
