/**
 * Scoring a series: every version whose hours reach into the window gets each hour that has an actual
 * scored and stored (rewritten when the actual was revised), in one transaction. Idempotent: scoring
 * the same hours again writes the same rows.
 */
import type { Database } from '@loadwright/db';
import { adjustPoints, adjustmentsOf, pointsOf } from '@loadwright/forecasts';
import { holidayDates, hourlyActuals, scorableSeries, versionsToScore, writeScores } from './score-repository';
import { scoreVersion, type HandedOnHour } from './score-version';
import { scaleWindowHours, seasonalPeriodHours } from './seasonal-naive-scale';

const hourMs = 3_600_000;

/** Hours looked back over by default: a week of versions plus a day of late or revised actuals. */
export const rescoreWindowHours = 192;

/** What scoring one series did. */
export interface ScoringOutcome {
  seriesId: number;
  versions: number;
  hours: number;
}

/**
 * Scores series `seriesId` as of `now`: versions whose hours end after `since` (default: the last
 * eight days) and began before now. A series scoring does not apply to (archived, not load, daily
 * readings) is left alone.
 */
export async function scoreSeries(db: Database, seriesId: number, options: { now?: Date; since?: Date } = {}): Promise<ScoringOutcome> {
  const now = options.now ?? new Date();
  const since = options.since ?? new Date(now.getTime() - rescoreWindowHours * hourMs);
  const outcome: ScoringOutcome = { seriesId, versions: 0, hours: 0 };
  const [target] = await scorableSeries(db, seriesId);
  if (!target) return outcome;
  const versions = await versionsToScore(db, seriesId, since, now);
  if (versions.length === 0) return outcome;
  const firstOrigin = versions[0]!.origin.getTime();
  // Actuals from the MASE scale's window (and its lagged week) before the first origin to now.
  const from = new Date(firstOrigin - (scaleWindowHours + seasonalPeriodHours) * hourMs);
  const ids = versions.map((v) => v.id);
  const [actuals, calendar, points, adjustments] = await Promise.all([
    hourlyActuals(db, target, from, now, versions[0]!.origin),
    holidayDates(db, from, now),
    pointsOf(db, ids),
    adjustmentsOf(db, ids),
  ]);
  const clocks = new Map<number, { date: string; hour: number }>();
  const scored = versions.flatMap((version) => {
    const own = points.get(version.id) ?? [];
    const adjusted = adjustPoints(own, adjustments.get(version.id) ?? []);
    // Scored as handed on: the planners' adjusted numbers where an adjustment covers the hour.
    const handedOn: HandedOnHour[] = own.map((point, i) => ({ ...point, ...(adjusted[i] ?? {}) }));
    return scoreVersion(version, handedOn, actuals, { timeZone: target.timeZone, holidays: calendar, clocks });
  });
  await db.transaction((tx) => writeScores(tx, seriesId, scored));
  outcome.versions = new Set(scored.map((h) => h.versionId)).size;
  outcome.hours = scored.length;
  return outcome;
}

/** Scores every series scoring applies to (the demo's first start and a full re-score). */
export async function scoreAllSeries(db: Database, options: { now?: Date; since?: Date } = {}): Promise<ScoringOutcome[]> {
  const outcomes: ScoringOutcome[] = [];
  for (const target of await scorableSeries(db)) outcomes.push(await scoreSeries(db, target.id, options));
  return outcomes;
}
