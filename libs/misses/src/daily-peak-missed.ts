/** "Daily peak missed": the local day's peak off by more than x % or its hour off by more than h hours. */
import { intervalsInLocalDay, localClock, startOfLocalDay } from '@loadwright/forecasts';
import { evidenceOf, hourMs, load, type HourPoint, type MissHit, type SeriesFacts } from './hour-point';
import { floorInUnit, type RuleSettings } from './rule-kinds';

/**
 * For every local day (in the series' time zone) whose every hour has both an actual and a forecast
 * — 24 hours, or 23 and 25 on the daylight-saving change days — compares the actual peak with the
 * forecast peak (the earlier hour wins a tie). A day misses when |forecast peak − actual peak| /
 * actual peak × 100 is strictly above `rule.threshold`, or when the peaks' instants are more than
 * `rule.peakHourTolerance` hours apart (elapsed hours, so a change day counts its real hours). Days
 * whose actual and forecast peaks are both below the floor are not judged. A day not yet complete is
 * not judged either: its peak may still come.
 */
export function dailyPeakMissed(points: readonly HourPoint[], rule: RuleSettings, series: SeriesFacts): MissHit[] {
  const threshold = rule.threshold ?? 5;
  const tolerance = rule.peakHourTolerance ?? 2;
  const floor = floorInUnit(rule, series.unit);
  const byDate = new Map<string, HourPoint[]>();
  for (const point of points) {
    if (point.actual === null || point.forecast === null) continue;
    const { date } = localClock(point.ts, series.timeZone);
    byDate.set(date, [...(byDate.get(date) ?? []), point]);
  }
  const hits: MissHit[] = [];
  for (const [date, day] of [...byDate.entries()].sort(([a], [b]) => a.localeCompare(b))) {
    const hours = intervalsInLocalDay(date, series.timeZone, 60);
    if (day.length < hours) continue;
    day.sort((a, b) => a.ts.getTime() - b.ts.getTime());
    const actualPeak = day.reduce((best, point) => (point.actual! > best.actual! ? point : best));
    const forecastPeak = day.reduce((best, point) => (point.forecast! > best.forecast! ? point : best));
    const actual = actualPeak.actual!;
    const forecast = forecastPeak.forecast!;
    if (Math.max(actual, forecast) < floor || actual <= 0) continue;
    const peakErrorPercent = (Math.abs(forecast - actual) / actual) * 100;
    const hoursOff = Math.abs(forecastPeak.ts.getTime() - actualPeak.ts.getTime()) / hourMs;
    const sizeMissed = peakErrorPercent > threshold;
    const timeMissed = hoursOff > tolerance;
    if (!sizeMissed && !timeMissed) continue;
    const start = new Date(startOfLocalDay(date, series.timeZone));
    const at = (point: HourPoint) => localClock(point.ts, series.timeZone).time.slice(0, 5);
    const parts = [
      sizeMissed
        ? `peak ${load(actual, series.unit)} against ${load(forecast, series.unit)} forecast (${peakErrorPercent.toFixed(1)} % off)`
        : null,
      timeMissed ? `peak at ${at(actualPeak)} against ${at(forecastPeak)} forecast (${hoursOff} hours off)` : null,
    ].filter(Boolean);
    hits.push({
      start,
      end: new Date(start.getTime() + hours * hourMs),
      evidence: [...new Set([actualPeak, forecastPeak])].sort((a, b) => a.ts.getTime() - b.ts.getTime()).map((point) => evidenceOf(point)),
      summary: `Daily peak of ${date} missed: ${parts.join('; ')}.`,
      measures: { actualPeak: actual, forecastPeak: forecast, peakErrorPercent, peakHoursOff: hoursOff },
    });
  }
  return hits;
}
