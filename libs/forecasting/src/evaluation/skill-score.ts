/**
 * Skill score of a forecast against a benchmark: 1 − score/benchmark score, for any loss-type score (MAE, RMSE,
 * MASE, Winkler, pinball). 1 is perfect, 0 is no better than the benchmark, negative is worse.
 * Method: Murphy (1988), Mon. Weather Rev. 116(12) (skill scores); Hyndman & Athanasopoulos (2021), FPP3 §5.9.
 * Conventions: returns null (documented, never Infinity) when the benchmark score is 0.
 * @throws ForecastingError 'invalid-argument' when a score is negative or not finite.
 * References: Murphy (1988); FPP3 §5.9.
 */
import { ForecastingError } from '../core/errors';

/** 1 − score/benchmarkScore, or null when the benchmark scored 0. */
export function skillScore(score: number, benchmarkScore: number): number | null {
  for (const [name, value] of [
    ['score', score],
    ['benchmarkScore', benchmarkScore],
  ] as const) {
    if (!Number.isFinite(value) || value < 0) {
      throw new ForecastingError('invalid-argument', 'skillScore', `${name} must be a finite loss ≥ 0, got ${value}`);
    }
  }
  return benchmarkScore === 0 ? null : 1 - score / benchmarkScore;
}
