/**
 * The operational misses, which judge the data and the schedule rather than the numbers: "Actuals
 * late", "No forecast by the deadline" and "Too many estimated hours".
 */
import { intervalsInLocalDay, localClock, startOfLocalDay } from '@loadwright/forecasts';
import { evidenceOf, hourMs, type HourPoint, type MissHit } from './hour-point';
import type { RuleSettings } from './rule-kinds';

/**
 * Actuals late: more than `rule.threshold` hours (strictly) between the end of the newest actual
 * (its start plus the series' interval) and `now`. The period runs from that end to the start of the
 * current hour; nothing fires for a series that never had actuals (there is nothing to be late).
 */
export function actualsLate(lastActualTs: Date | null, intervalMinutes: number, now: Date, rule: RuleSettings): MissHit[] {
  if (!lastActualTs) return [];
  const limit = rule.threshold ?? 6;
  const dataEnd = lastActualTs.getTime() + intervalMinutes * 60_000;
  const lateHours = (now.getTime() - dataEnd) / hourMs;
  const periodEnd = Math.floor(now.getTime() / hourMs) * hourMs;
  if (lateHours <= limit || periodEnd <= dataEnd) return [];
  return [
    {
      start: new Date(dataEnd),
      end: new Date(periodEnd),
      evidence: [],
      summary: `No actuals for ${lateHours.toFixed(1)} hours (expected within ${limit}); the newest reading ends ${new Date(dataEnd).toISOString()}.`,
      measures: { hoursLate: lateHours },
    },
  ];
}

/**
 * The instant at which the wall clock of `timeZone` shows `minute` minutes past midnight on local
 * `date`, correct on daylight-saving change days (07:00 is 07:00 on the wall, not seven elapsed hours).
 */
export function localWallInstant(date: string, minute: number, timeZone: string): number {
  const start = startOfLocalDay(date, timeZone);
  const guess = start + minute * 60_000;
  return guess - (localClock(guess, timeZone).offsetMinutes - localClock(start, timeZone).offsetMinutes) * 60_000;
}

/**
 * No forecast by the deadline: once today's deadline (`deadlineMinute` after local midnight in the
 * organisation's zone) has passed, the series must have a version issued in the 24 hours before it.
 * The period is the hour after the deadline.
 */
export function forecastLate(latestIssuedAt: Date | null, now: Date, timeZone: string, deadlineMinute: number): MissHit[] {
  const today = localClock(now, timeZone).date;
  const deadline = localWallInstant(today, deadlineMinute, timeZone);
  if (now.getTime() < deadline) return [];
  if (latestIssuedAt && latestIssuedAt.getTime() >= deadline - 24 * hourMs && latestIssuedAt.getTime() <= deadline) return [];
  const at = localClock(deadline, timeZone).time.slice(0, 5);
  return [
    {
      start: new Date(deadline),
      end: new Date(deadline + hourMs),
      evidence: [],
      summary: latestIssuedAt
        ? `No forecast written by the ${at} deadline on ${today}; the newest was issued ${latestIssuedAt.toISOString()}.`
        : `No forecast written by the ${at} deadline on ${today}; the series has never had one.`,
      measures: { hoursSinceLastForecast: latestIssuedAt ? (deadline - latestIssuedAt.getTime()) / hourMs : -1 },
    },
  ];
}

/**
 * Too many estimated hours: a local day (series' zone) whose actuals hold strictly more than
 * `rule.threshold` hours with an estimate in place of a raw reading. The period is the local day
 * (23, 24 or 25 hours).
 */
export function estimatedHours(points: readonly HourPoint[], rule: RuleSettings, timeZone: string): MissHit[] {
  const limit = rule.threshold ?? 4;
  const byDate = new Map<string, HourPoint[]>();
  for (const point of points) {
    if (point.actual === null || !point.estimated) continue;
    const { date } = localClock(point.ts, timeZone);
    byDate.set(date, [...(byDate.get(date) ?? []), point]);
  }
  const hits: MissHit[] = [];
  for (const [date, estimated] of [...byDate.entries()].sort(([a], [b]) => a.localeCompare(b))) {
    if (estimated.length <= limit) continue;
    const start = startOfLocalDay(date, timeZone);
    hits.push({
      start: new Date(start),
      end: new Date(start + intervalsInLocalDay(date, timeZone, 60) * hourMs),
      evidence: estimated.sort((a, b) => a.ts.getTime() - b.ts.getTime()).map((point) => evidenceOf(point)),
      summary: `${estimated.length} estimated hours in the actuals of ${date} (limit ${limit}): judge this day's misses with care.`,
      measures: { estimatedHours: estimated.length },
    });
  }
  return hits;
}
