/** "Creeping bias": the tracking signal beyond ±limit for k consecutive hours. */
import { evidenceOf, forHours, load, runsOf, type HourPoint, type MissHit, type SeriesFacts } from './hour-point';
import type { RuleSettings } from './rule-kinds';

/**
 * The tracking signal at each hour with an actual and a forecast, over the hours given (oldest first):
 * TS_t = Σ_{i≤t} e_i / MAD_t with e = actual − forecast and MAD_t = (1/n_t) Σ_{i≤t} |e_i|: the
 * running-sum form of operations-management texts (R. G. Brown's MAD-based control of forecasts),
 * not Trigg's smoothed variant. Common practice reviews a forecast once |TS| passes about 4. Since
 * |Σe| ≤ Σ|e|, |TS_t| ≤ n_t: errors all on one side give TS_t = ±n_t. Undefined (absent) while MAD is 0.
 */
export function trackingSignal(points: readonly HourPoint[]): Map<number, number> {
  const signal = new Map<number, number>();
  let sum = 0;
  let sumAbs = 0;
  let n = 0;
  for (const point of [...points].sort((a, b) => a.ts.getTime() - b.ts.getTime())) {
    if (point.actual === null || point.forecast === null) continue;
    const error = point.actual - point.forecast;
    sum += error;
    sumAbs += Math.abs(error);
    n++;
    if (sumAbs > 0) signal.set(point.ts.getTime(), sum / (sumAbs / n));
  }
  return signal;
}

/** Every maximal run of at least `rule.hours` consecutive hours with |TS| strictly beyond `rule.threshold` (default 4). */
export function creepingBias(points: readonly HourPoint[], rule: RuleSettings, series: SeriesFacts): MissHit[] {
  const limit = rule.threshold ?? 4;
  const signal = trackingSignal(points);
  const beyond = (point: HourPoint) => Math.abs(signal.get(point.ts.getTime()) ?? 0) > limit;
  return runsOf(points, rule.hours, beyond).map((run) => {
    const last = signal.get(run.at(-1)!.ts.getTime())!;
    const evidence = run.map((point) => evidenceOf(point));
    const meanError = evidence.reduce((sum, hour) => sum + hour.error!, 0) / evidence.length;
    return {
      start: run[0]!.ts,
      end: new Date(run.at(-1)!.ts.getTime() + 3_600_000),
      evidence,
      summary: `Forecast persistently ${last > 0 ? 'low' : 'high'}: tracking signal ${last.toFixed(1)} (limit ±${limit}) ${forHours(run.length)}; errors average ${load(meanError, series.unit)}.`,
      measures: { trackingSignal: last, hours: run.length, meanError },
    };
  });
}
