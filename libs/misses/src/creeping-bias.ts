/** "Creeping bias": the tracking signal beyond ±limit for k consecutive hours. */
import { evidenceOf, forHours, hourMs, load, runsOf, type HourPoint, type MissHit, type SeriesFacts } from './hour-point';
import type { RuleSettings } from './rule-kinds';

/**
 * Hours of errors the tracking signal sums: one day of hourly errors. A fixed trailing window makes the
 * signal at an hour a property of that hour (the same whenever detection runs) and lets a bias that has
 * stopped leave the sum, so a miss ends when the errors stop piling up. The window length is our choice
 * (the running-sum signal is commonly kept over a fixed number of recent periods).
 */
export const trackingWindowHours = 24;

/**
 * The tracking signal at each hour with an actual and a forecast (points in any order):
 * TS_t = Σ e_i / MAD_t over the hours i in (t − W, t] that have both values, with e = actual − forecast,
 * MAD_t = (1/n_t) Σ |e_i| and W = `windowHours`: the running-sum form of operations-management texts
 * (R. G. Brown's MAD-based control of forecasts), not Trigg's smoothed variant. Common practice reviews a
 * forecast once |TS| passes about 4. Since |Σe| ≤ Σ|e|, |TS_t| ≤ n_t: errors all on one side give
 * TS_t = ±n_t. Undefined (absent) while MAD is 0.
 */
export function trackingSignal(points: readonly HourPoint[], windowHours = trackingWindowHours): Map<number, number> {
  const errors = [...points]
    .filter((point) => point.actual !== null && point.forecast !== null)
    .sort((a, b) => a.ts.getTime() - b.ts.getTime())
    .map((point) => ({ t: point.ts.getTime(), e: point.actual! - point.forecast! }));
  const signal = new Map<number, number>();
  let sum = 0;
  let sumAbs = 0;
  let first = 0;
  errors.forEach(({ t, e }, i) => {
    sum += e;
    sumAbs += Math.abs(e);
    // Errors at or before t − W have left the window.
    while (errors[first]!.t <= t - windowHours * hourMs) {
      sum -= errors[first]!.e;
      sumAbs -= Math.abs(errors[first]!.e);
      first++;
    }
    const n = i - first + 1;
    // Adding and removing leaves rounding dust: a window whose errors are all zero has no signal.
    if (sumAbs > 1e-9 * n) signal.set(t, sum / (sumAbs / n));
  });
  return signal;
}

/**
 * Every maximal run of at least `rule.hours` consecutive hours with |TS| strictly beyond `rule.threshold`
 * (default 4), among the hours from `judgeFrom` on; earlier points only feed the signal's window.
 */
export function creepingBias(points: readonly HourPoint[], rule: RuleSettings, series: SeriesFacts, judgeFrom?: Date): MissHit[] {
  const limit = rule.threshold ?? 4;
  const signal = trackingSignal(points);
  const judged = judgeFrom ? points.filter((point) => point.ts >= judgeFrom) : points;
  const beyond = (point: HourPoint) => Math.abs(signal.get(point.ts.getTime()) ?? 0) > limit;
  return runsOf(judged, rule.hours, beyond).map((run) => {
    const last = signal.get(run.at(-1)!.ts.getTime())!;
    const evidence = run.map((point) => evidenceOf(point));
    const meanError = evidence.reduce((sum, hour) => sum + hour.error!, 0) / evidence.length;
    return {
      start: run[0]!.ts,
      end: new Date(run.at(-1)!.ts.getTime() + hourMs),
      evidence,
      summary: `Forecast persistently ${last > 0 ? 'low' : 'high'}: tracking signal ${last.toFixed(1)} (limit ±${limit}) ${forHours(run.length)}; errors average ${load(meanError, series.unit)}.`,
      measures: { trackingSignal: last, hours: run.length, meanError },
    };
  });
}
