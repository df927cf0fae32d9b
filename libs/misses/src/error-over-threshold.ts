/** "Error over threshold": absolute percentage error above the threshold for k consecutive hours. */
import { evidenceOf, forHours, load, runsOf, type HourPoint, type MissHit, type SeriesFacts } from './hour-point';
import { floorInUnit, type RuleSettings } from './rule-kinds';

/**
 * Every maximal run of at least `rule.hours` consecutive hours whose absolute percentage error
 * |actual − forecast| / |actual| × 100 is strictly above `rule.threshold`. Hours where both actual
 * and forecast are below the rule's floor (kW, converted to the series' unit) are not judged, so a
 * small feeder at night cannot raise a miss on a few kW; such an hour ends a run, as does an hour
 * without an actual or a forecast, or with an actual of zero (no percentage exists).
 */
export function errorOverThreshold(points: readonly HourPoint[], rule: RuleSettings, series: SeriesFacts): MissHit[] {
  const threshold = rule.threshold ?? 10;
  const floor = floorInUnit(rule, series.unit);
  const over = (point: HourPoint) => {
    if (point.actual === null || point.forecast === null || point.actual === 0) return false;
    if (Math.max(Math.abs(point.actual), Math.abs(point.forecast)) < floor) return false;
    return (Math.abs(point.actual - point.forecast) / Math.abs(point.actual)) * 100 > threshold;
  };
  return runsOf(points, rule.hours, over).map((run) => {
    const evidence = run.map((point) => evidenceOf(point));
    const worst = Math.max(...evidence.map((hour) => hour.percentError!));
    const meanError = evidence.reduce((sum, hour) => sum + hour.error!, 0) / evidence.length;
    return {
      start: run[0]!.ts,
      end: new Date(run.at(-1)!.ts.getTime() + 3_600_000),
      evidence,
      summary: `Error above ${threshold} % ${forHours(run.length)} (worst ${worst.toFixed(1)} %, forecast ${meanError > 0 ? 'low' : 'high'} by ${load(Math.abs(meanError), series.unit)} on average).`,
      measures: { hours: run.length, worstPercentError: worst, meanError },
    };
  });
}
