/** One entry point for every kind: what a rule finds in one series' hours. */
import { actualsLate, estimatedHours, forecastLate } from './operational-misses';
import { creepingBias } from './creeping-bias';
import { dailyPeakMissed } from './daily-peak-missed';
import { errorOverThreshold } from './error-over-threshold';
import type { HourPoint, MissHit, SeriesFacts } from './hour-point';
import { outsideBand } from './outside-band';
import type { RuleSettings } from './rule-kinds';

/** Everything a rule may look at for one series. */
export interface EvaluationInput {
  /** Hourly actual-against-forecast points, any order. */
  points: readonly HourPoint[];
  /** First hour judged; earlier points only feed the tracking signal's window (all judged when absent). */
  judgeFrom?: Date;
  series: SeriesFacts & { intervalMinutes: number };
  now: Date;
  /** Start of the newest interval with an actual. */
  lastActualTs: Date | null;
  /** When the series' newest forecast version was issued. */
  latestIssuedAt: Date | null;
  organisation: { timeZone: string; forecastDeadlineMinute: number };
}

/** The misses `rule` finds in `input`. Pure: the same input always gives the same hits. */
export function evaluateRule(rule: RuleSettings, input: EvaluationInput): MissHit[] {
  const judgeFrom = input.judgeFrom;
  const points = judgeFrom ? input.points.filter((point) => point.ts >= judgeFrom) : input.points;
  switch (rule.kind) {
    case 'outside_band':
      return outsideBand(points, rule, input.series);
    case 'error_over_threshold':
      return errorOverThreshold(points, rule, input.series);
    case 'daily_peak_missed':
      return dailyPeakMissed(points, rule, input.series);
    case 'creeping_bias':
      return creepingBias(input.points, rule, input.series, judgeFrom);
    case 'actuals_late':
      return actualsLate(input.lastActualTs, input.series.intervalMinutes, input.now, rule);
    case 'forecast_late':
      return forecastLate(input.latestIssuedAt, input.now, input.organisation.timeZone, input.organisation.forecastDeadlineMinute);
    case 'estimated_hours':
      return estimatedHours(points, rule, input.series.timeZone);
  }
}
