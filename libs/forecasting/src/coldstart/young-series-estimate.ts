/**
 * Level-and-profile estimate for a young series: the peers' prior, updated by the series' own observations,
 * so that the estimate starts at the peer group and moves to the series' own data as observations accrue.
 *
 * Model: x_t = L + P_{slot(t)} + e_t, e_t ~ N(0, σ²) with σ² known (the peers' pooled value unless given);
 *   independent priors L ~ N(m_L, v_L), P_k ~ N(m_k, v_k) from peerProfilePrior.
 * Method: the conjugate normal update of a Gaussian linear model (Lindley & Smith 1972, J. R. Stat. Soc. B 34(1);
 *   Gelman et al. 2013, Bayesian Data Analysis, 3rd ed., §14.8): posterior precision Λ = V₀⁻¹ + AᵀA/σ²,
 *   posterior mean Λ⁻¹(V₀⁻¹m₀ + Aᵀx/σ²), A the design of ones (level) and slot indicators. Λ is an arrow matrix
 *   (n/σ² + 1/v_L in the corner, slot counts c_k/σ² on the border, 1/v_k + c_k/σ² on the diagonal), so it is
 *   solved exactly in O(K) through its Schur complement S = 1/v_L + n/σ² − Σ_k (c_k/σ²)²/(1/v_k + c_k/σ²).
 *   With no profile slots observed this is the scalar update 1/(1/v_L + n/σ²) of conjugate-normal.ts.
 * Conventions: `expected[k]` = posterior mean of L + P_k, the value to forecast for slot k; `dataWeight[k]` =
 *   1 − Var_post(L + P_k)/Var_prior(L + P_k), 0 before any observation and → 1 as the series' own data take over.
 * @throws ForecastingError 'invalid-argument' (offset, noise variance), 'non-finite-input'.
 * References: Lindley & Smith (1972); Gelman et al. (2013) §14.8; Morris (1983) for the peer prior.
 */
import { ForecastingError, assertFinite } from '../core/errors';
import { checkPositive, type GaussianBelief } from './conjugate-normal';
import { checkOffset, slotOf, type CycleSeries, type ProfilePrior } from './peer-prior';

/** The posterior level and profile of a young series. */
export interface ColdStartEstimate {
  /** Observations used. */
  n: number;
  level: GaussianBelief;
  profile: GaussianBelief[];
  /** Posterior mean of level + profile per slot: the load to expect in that slot. */
  expected: Float64Array;
  /** Posterior variance of level + profile per slot. */
  expectedVariance: Float64Array;
  /** 1 − posterior/prior variance of level + profile per slot, in [0, 1). */
  dataWeight: Float64Array;
  /** Noise variance used. */
  noiseVariance: number;
}

/** Updates the peer prior with the young series' observations (see the file comment). */
export function coldStartEstimate(young: CycleSeries, prior: ProfilePrior, options: { noiseVariance?: number } = {}): ColdStartEstimate {
  const fn = 'coldStartEstimate';
  const K = prior.period;
  const offset = young.offset ?? 0;
  checkOffset(fn, offset, K);
  assertFinite(fn, young.values, 'young series');
  if (prior.profile.length !== K)
    throw new ForecastingError('invalid-argument', fn, `the prior has ${prior.profile.length} slots for period ${K}`);
  const noise = options.noiseVariance ?? prior.noiseVariance;
  checkPositive(fn, 'noise variance', noise);
  checkPositive(fn, 'prior level variance', prior.level.variance);
  prior.profile.forEach((p, k) => checkPositive(fn, `prior variance of slot ${k}`, p.variance));

  const n = young.values.length;
  const counts = new Float64Array(K);
  const sums = new Float64Array(K);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const k = slotOf(offset, i, K);
    counts[k]++;
    sums[k] += young.values[i];
    total += young.values[i];
  }

  // Arrow-matrix blocks of Λ and the right-hand side b = V₀⁻¹m₀ + Aᵀx/σ².
  const border = counts.map((c) => c / noise); // Λ_{L,k}
  const diagonal = prior.profile.map((p, k) => 1 / p.variance + counts[k] / noise); // Λ_{k,k}
  const rhsProfile = prior.profile.map((p, k) => p.mean / p.variance + sums[k] / noise);
  const rhsLevel = prior.level.mean / prior.level.variance + total / noise;
  let schur = 1 / prior.level.variance + n / noise;
  let reducedRhs = rhsLevel;
  for (let k = 0; k < K; k++) {
    schur -= (border[k] * border[k]) / diagonal[k];
    reducedRhs -= (border[k] / diagonal[k]) * rhsProfile[k];
  }
  const levelMean = reducedRhs / schur;
  const levelVariance = 1 / schur;

  const profile: GaussianBelief[] = [];
  const expected = new Float64Array(K);
  const expectedVariance = new Float64Array(K);
  const dataWeight = new Float64Array(K);
  for (let k = 0; k < K; k++) {
    const ratio = border[k] / diagonal[k];
    const mean = (rhsProfile[k] - border[k] * levelMean) / diagonal[k];
    const variance = 1 / diagonal[k] + (ratio * ratio) / schur;
    const covariance = -ratio / schur;
    profile.push({ mean, variance });
    expected[k] = levelMean + mean;
    expectedVariance[k] = levelVariance + variance + 2 * covariance;
    dataWeight[k] = 1 - expectedVariance[k] / (prior.level.variance + prior.profile[k].variance);
  }
  return { n, level: { mean: levelMean, variance: levelVariance }, profile, expected, expectedVariance, dataWeight, noiseVariance: noise };
}
