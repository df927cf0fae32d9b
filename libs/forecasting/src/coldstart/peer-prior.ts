/**
 * Peer-group priors for a young series: the level and the hour-of-day (or hour-of-week) profile that similar
 * series show, as Gaussian beliefs, plus the noise variance they leave unexplained.
 *
 * Model, per peer i and period t with slot k = slot(t) in a cycle of length K (24 or 168):
 *   x_{i,t} = L_i + P_{i,k} + e_{i,t},  Σ_k P_{i,k} = 0,  e ~ N(0, σ²).
 * Method: per peer, the slot means x̄_{i,k}; L_i = mean_k x̄_{i,k} (so uneven slot coverage does not tilt the
 *   level) and P_{i,k} = x̄_{i,k} − L_i. Across the peers, the prior of the level is N(mean_i L_i, var_i L_i) and
 *   of each slot N(mean_i P_{i,k}, var_i P_{i,k}) (the empirical-Bayes moment prior of Morris 1983, JASA 78(381),
 *   without subtracting the peers' own estimation noise, which keeps the prior a little wide). σ² is pooled:
 *   Σ_i RSS_i / Σ_i (n_i − K), RSS_i the squared deviations from L_i + P_{i,k}.
 * Conventions: sample variances with divisor (peers − 1) (Bessel's correction); every peer must cover every slot
 *   and have more than K values; peers must be in the young series' units (normalise feeders of different sizes,
 *   e.g. per customer or per kVA, before pooling). `varianceFloor` is added to every prior variance.
 * @throws ForecastingError 'too-few-observations' (fewer than 2 peers, a peer not longer than K or missing a
 *   slot); 'invalid-argument' (bad period, offset or floor); 'non-finite-input'; 'constant-series' when the peers
 *   agree exactly on the level or a slot and no variance floor is set.
 * References: Morris (1983), Parametric empirical Bayes inference, JASA 78(381); Gelman et al. (2013) §5.
 */
import { ForecastingError, assertFinite } from '../core/errors';
import type { GaussianBelief } from './conjugate-normal';

/** A series placed in its cycle: values[i] falls in slot (offset + i) mod period. */
export interface CycleSeries {
  values: ArrayLike<number>;
  /** Slot of values[0], e.g. its hour of week (default 0). */
  offset?: number;
}

/** Prior beliefs about a young series' level and profile, from its peers. */
export interface ProfilePrior {
  /** Cycle length K (24 hour-of-day, 168 hour-of-week). */
  period: number;
  level: GaussianBelief;
  /** One belief per slot 0..K−1. */
  profile: GaussianBelief[];
  /** Pooled noise variance σ² around each peer's level + profile. */
  noiseVariance: number;
  /** Number of peers pooled. */
  peers: number;
}

/** One peer's level, profile and residual sum of squares. */
interface PeerEstimate {
  level: number;
  profile: Float64Array;
  rss: number;
  df: number;
}

/** Gaussian belief from peer estimates: their mean and sample variance (divisor count − 1) plus a floor. */
export function gaussianPriorFromEstimates(estimates: ArrayLike<number>, varianceFloor = 0): GaussianBelief {
  const fn = 'gaussianPriorFromEstimates';
  if (estimates.length < 2)
    throw new ForecastingError('too-few-observations', fn, `needs at least 2 peer estimates for a variance, got ${estimates.length}`);
  assertFinite(fn, estimates, 'estimates');
  if (!(Number.isFinite(varianceFloor) && varianceFloor >= 0))
    throw new ForecastingError('invalid-argument', fn, `varianceFloor must be ≥ 0, got ${varianceFloor}`);
  let mean = 0;
  for (let i = 0; i < estimates.length; i++) mean += estimates[i];
  mean /= estimates.length;
  let ss = 0;
  for (let i = 0; i < estimates.length; i++) ss += (estimates[i] - mean) ** 2;
  const besselsCorrection = estimates.length - 1;
  const variance = ss / besselsCorrection + varianceFloor;
  if (!(variance > 0)) {
    throw new ForecastingError('constant-series', fn, 'the peers agree exactly, so the prior variance is 0; pass a varianceFloor > 0');
  }
  return { mean, variance };
}

/** Turns peer series into a prior on level and profile (see the file comment). */
export function peerProfilePrior(peers: readonly CycleSeries[], options: { period: number; varianceFloor?: number }): ProfilePrior {
  const fn = 'peerProfilePrior';
  const { period } = options;
  if (!Number.isInteger(period) || period < 1)
    throw new ForecastingError('invalid-argument', fn, `period must be a positive integer, got ${period}`);
  if (peers.length < 2) throw new ForecastingError('too-few-observations', fn, `needs at least 2 peers, got ${peers.length}`);
  const estimates = peers.map((peer, i) => estimatePeer(fn, peer, period, i));
  const floor = options.varianceFloor ?? 0;
  const level = gaussianPriorFromEstimates(
    estimates.map((e) => e.level),
    floor,
  );
  const profile = Array.from({ length: period }, (_, k) =>
    gaussianPriorFromEstimates(
      estimates.map((e) => e.profile[k]),
      floor,
    ),
  );
  const rss = estimates.reduce((s, e) => s + e.rss, 0);
  const df = estimates.reduce((s, e) => s + e.df, 0);
  if (!(rss > 0)) throw new ForecastingError('constant-series', fn, 'the peers follow their profiles exactly, so the noise variance is 0');
  return { period, level, profile, noiseVariance: rss / df, peers: peers.length };
}

/** Slot of values[i] in a cycle of `period`, given the series' offset. */
export function slotOf(offset: number, i: number, period: number): number {
  return (offset + i) % period;
}

/** Throws unless the offset is an integer in [0, period). */
export function checkOffset(fn: string, offset: number, period: number): void {
  if (!Number.isInteger(offset) || offset < 0 || offset >= period) {
    throw new ForecastingError('invalid-argument', fn, `offset must be an integer in [0, ${period}), got ${offset}`);
  }
}

/** Level, zero-sum profile and residual sum of squares of one peer. */
function estimatePeer(fn: string, peer: CycleSeries, period: number, index: number): PeerEstimate {
  const offset = peer.offset ?? 0;
  checkOffset(fn, offset, period);
  assertFinite(fn, peer.values, `peer ${index}`);
  const n = peer.values.length;
  if (n <= period)
    throw new ForecastingError('too-few-observations', fn, `peer ${index} has ${n} values; needs more than one cycle of ${period}`);
  const sums = new Float64Array(period);
  const counts = new Float64Array(period);
  for (let i = 0; i < n; i++) {
    const k = slotOf(offset, i, period);
    sums[k] += peer.values[i];
    counts[k]++;
  }
  const slotMeans = sums.map((s, k) => s / counts[k]);
  const level = slotMeans.reduce((s, v) => s + v, 0) / period;
  const profile = slotMeans.map((v) => v - level);
  let rss = 0;
  for (let i = 0; i < n; i++) rss += (peer.values[i] - slotMeans[slotOf(offset, i, period)]) ** 2;
  return { level, profile, rss, df: n - period };
}
