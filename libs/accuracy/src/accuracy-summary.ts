/**
 * The accuracy of a set of scored hours, each figure computed by the engine's published definition:
 *
 * - MAE, RMSE, MAPE (percent): Hyndman & Koehler (2006), Int. J. Forecasting 22(4), §3.
 * - MASE: mean of the scaled errors |e_t| / Q_v, each hour scaled by its own version's Q (see
 *   seasonal-naive-scale.ts), so hours of different versions and series pool into one unit-free figure
 *   (Hyndman & Koehler 2006, §4).
 * - Skill against seasonal naive: 1 − MAE / MAE of the seasonal-naive forecast of the same hours (Murphy
 *   1988, Mon. Weather Rev. 116(12); FPP3 §5.9), over the hours whose naive value exists.
 * - Coverage of the 80 % and 95 % bands: share of actuals inside, endpoints included.
 * - Interval (Winkler) score of each band: Winkler (1972), the interval score of Gneiting & Raftery (2007),
 *   JASA 102(477), §6.2.
 * - Pinball loss: the mean over the four quantiles the bands carry (τ = 0.025, 0.10, 0.90, 0.975, the
 *   lower and upper bounds of the central 95 % and 80 % intervals) of the quantile score of Gneiting &
 *   Raftery (2007), §6.1 (Koenker & Bassett 1978), averaged over quantiles as in GEFCom2014 (Hong et al.
 *   2016, Int. J. Forecasting 32(3)).
 */
import { coverage, mae, mape, pinball, rmse, skillScore, winkler } from '@loadwright/forecasting';
import type { ScoredHour } from './scored-hour';

/** Accuracy of some scored hours; figures that cannot be formed are null (documented per field). */
export interface AccuracySummary {
  hours: number;
  mae: number;
  rmse: number;
  /** Null when some actual is 0. */
  mape: number | null;
  /** Null when no hour has a scale. */
  mase: number | null;
  /** MAE of seasonal naive over the hours that have a naive value; null when none has. */
  naiveMae: number | null;
  /** 1 − MAE/naive MAE over those hours; null without naive values or when naive was perfect. */
  skill: number | null;
  coverage80: number;
  coverage95: number;
  winkler80: number;
  winkler95: number;
  pinball: number;
}

/** The quantile levels the stored bands stand for, with the bound that carries each. */
const bandQuantiles: ReadonlyArray<readonly [number, (h: ScoredHour) => number]> = [
  [0.025, (h) => h.lower95],
  [0.1, (h) => h.lower80],
  [0.9, (h) => h.upper80],
  [0.975, (h) => h.upper95],
];

/** The summary of `hours`, or null when there are none. */
export function summariseAccuracy(hours: readonly ScoredHour[]): AccuracySummary | null {
  if (hours.length === 0) return null;
  const actual = hours.map((h) => h.actual);
  const forecast = hours.map((h) => h.forecast);
  const lower80 = hours.map((h) => h.lower80);
  const upper80 = hours.map((h) => h.upper80);
  const lower95 = hours.map((h) => h.lower95);
  const upper95 = hours.map((h) => h.upper95);
  const scaled = hours.filter((h) => h.scale !== null);
  const mase = scaled.length
    ? mae(
        scaled.map((h) => h.actual / h.scale!),
        scaled.map((h) => h.forecast / h.scale!),
      )
    : null;
  const benchmarked = hours.filter((h) => h.naive !== null);
  let naiveMae: number | null = null;
  let skill: number | null = null;
  if (benchmarked.length) {
    const benchmarkActual = benchmarked.map((h) => h.actual);
    naiveMae = mae(
      benchmarkActual,
      benchmarked.map((h) => h.naive!),
    );
    skill = skillScore(
      mae(
        benchmarkActual,
        benchmarked.map((h) => h.forecast),
      ),
      naiveMae,
    );
  }
  const pinballs = bandQuantiles.map(([tau, bound]) => pinball(actual, hours.map(bound), tau));
  return {
    hours: hours.length,
    mae: mae(actual, forecast),
    rmse: rmse(actual, forecast),
    mape: mape(actual, forecast),
    mase,
    naiveMae,
    skill,
    coverage80: coverage(actual, lower80, upper80),
    coverage95: coverage(actual, lower95, upper95),
    winkler80: winkler(actual, lower80, upper80, 80),
    winkler95: winkler(actual, lower95, upper95, 95),
    pinball: pinballs.reduce((s, v) => s + v, 0) / pinballs.length,
  };
}
