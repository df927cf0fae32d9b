/** "Outside the band": the actual outside the forecast's band (95 % by default) for k consecutive hours. */
import { bandAt, evidenceOf, forHours, load, runsOf, type HourPoint, type MissHit, type SeriesFacts } from './hour-point';
import type { RuleSettings } from './rule-kinds';

/**
 * Every maximal run of at least `rule.hours` consecutive hours whose actual lies strictly outside the
 * band at `rule.bandLevel` percent (an actual on a bound is inside). An hour without an actual or
 * without a forecast ends a run.
 */
export function outsideBand(points: readonly HourPoint[], rule: RuleSettings, series: SeriesFacts): MissHit[] {
  const level = rule.bandLevel ?? 95;
  const outside = (point: HourPoint) => {
    const band = bandAt(point, level);
    if (point.actual === null || band.lower === null || band.upper === null) return false;
    return point.actual < band.lower || point.actual > band.upper;
  };
  return runsOf(points, rule.hours, outside).map((run) => {
    const evidence = run.map((point) => evidenceOf(point, bandAt(point, level)));
    const distances = evidence.map((hour) => (hour.actual! > hour.upper! ? hour.actual! - hour.upper! : hour.lower! - hour.actual!));
    const above = evidence.filter((hour) => hour.actual! > hour.upper!).length;
    const side = above === run.length ? 'above' : above === 0 ? 'below' : 'outside';
    const furthest = Math.max(...distances);
    return {
      start: run[0]!.ts,
      end: new Date(run.at(-1)!.ts.getTime() + 3_600_000),
      evidence,
      summary: `Actual ${side} the ${level} % band ${forHours(run.length)}, at most ${load(furthest, series.unit)} beyond it.`,
      measures: { hours: run.length, furthestBeyondBand: furthest, hoursAbove: above },
    };
  });
}
