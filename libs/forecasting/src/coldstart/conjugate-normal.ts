/**
 * Conjugate normal update of a Gaussian mean with known noise variance: how much a few observations of a young
 * series should move a prior belief about its level.
 *
 * Model: y_i | μ ~ N(μ, σ²) iid, i = 1..n, with σ² known; prior μ ~ N(m₀, v₀).
 * Method: posterior μ | y ~ N(m_n, v_n) with precision 1/v_n = 1/v₀ + n/σ² and
 *   m_n = v_n (m₀/v₀ + n ȳ/σ²) = w ȳ + (1 − w) m₀, w = (n/σ²)/(1/v₀ + n/σ²) (Gelman et al. 2013, Bayesian Data
 *   Analysis, 3rd ed., §2.5; DeGroot 1970, Optimal Statistical Decisions, §9.5).
 * Conventions: n = 0 returns the prior (w = 0); variances must be positive (a zero prior variance would freeze
 *   the belief, a zero noise variance would make one observation final).
 * @throws ForecastingError 'invalid-argument' for non-positive variances or a non-integer or negative n;
 *   'non-finite-input' for non-finite means.
 * References: Gelman et al. (2013) §2.5; DeGroot (1970) §9.5.
 */
import { ForecastingError } from '../core/errors';

/** A Gaussian belief about one quantity. */
export interface GaussianBelief {
  mean: number;
  variance: number;
}

/** The posterior and how far it moved towards the data. */
export interface GaussianPosterior extends GaussianBelief {
  /** 1/variance. */
  precision: number;
  /** w: weight on the sample mean (1 − w on the prior mean). */
  weightOnSample: number;
}

/** Throws unless `value` is a finite number > 0. */
export function checkPositive(fn: string, name: string, value: number): void {
  if (!(Number.isFinite(value) && value > 0))
    throw new ForecastingError('invalid-argument', fn, `${name} must be a finite number > 0, got ${value}`);
}

/** Posterior of a Gaussian mean after n observations with sample mean ȳ and known noise variance σ². */
export function conjugateNormalUpdate(
  prior: GaussianBelief,
  sample: { n: number; mean: number },
  noiseVariance: number,
): GaussianPosterior {
  const fn = 'conjugateNormalUpdate';
  checkPositive(fn, 'prior variance', prior.variance);
  checkPositive(fn, 'noise variance', noiseVariance);
  if (!Number.isInteger(sample.n) || sample.n < 0)
    throw new ForecastingError('invalid-argument', fn, `n must be an integer ≥ 0, got ${sample.n}`);
  if (!Number.isFinite(prior.mean)) throw new ForecastingError('non-finite-input', fn, `prior mean is ${prior.mean}`);
  if (sample.n > 0 && !Number.isFinite(sample.mean)) throw new ForecastingError('non-finite-input', fn, `sample mean is ${sample.mean}`);
  const priorPrecision = 1 / prior.variance;
  const dataPrecision = sample.n / noiseVariance;
  const precision = priorPrecision + dataPrecision;
  const weightOnSample = dataPrecision / precision;
  const mean = sample.n === 0 ? prior.mean : weightOnSample * sample.mean + (1 - weightOnSample) * prior.mean;
  return { mean, variance: 1 / precision, precision, weightOnSample };
}
