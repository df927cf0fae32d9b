/**
 * Peer priors, hand-computed (arithmetic in the comments): slot means, zero-sum profiles, Bessel-corrected
 * variances across peers and the pooled noise variance.
 */
import { describe, expect, it } from 'vitest';
import { gaussianPriorFromEstimates, peerProfilePrior } from './peer-prior';

describe('gaussianPriorFromEstimates', () => {
  it('takes the mean and the (k − 1)-divisor variance', () => {
    // [2, 4, 6]: mean 4, squared deviations 4 + 0 + 4 = 8, divided by 2 → 4.
    expect(gaussianPriorFromEstimates([2, 4, 6])).toEqual({ mean: 4, variance: 4 });
    expect(gaussianPriorFromEstimates([2, 4, 6], 0.5).variance).toBe(4.5);
  });

  it('needs two peers and a positive variance', () => {
    expect(() => gaussianPriorFromEstimates([1])).toThrowError(expect.objectContaining({ code: 'too-few-observations' }));
    expect(() => gaussianPriorFromEstimates([3, 3])).toThrowError(expect.objectContaining({ code: 'constant-series' }));
  });
});

describe('peerProfilePrior', () => {
  it('pools two peers with a 2-slot cycle', () => {
    // Peer A, offset 0, values [10, 20, 12, 22]: slot 0 → (10 + 12)/2 = 11, slot 1 → (20 + 22)/2 = 21;
    //   level (11 + 21)/2 = 16, profile [−5, +5]; residuals −1, −1, +1, +1 → RSS 4, df 4 − 2 = 2.
    // Peer B, offset 1 (starts in slot 1), values [30, 14, 34, 18, 32]: slot 1 → (30 + 34 + 32)/3 = 32,
    //   slot 0 → (14 + 18)/2 = 16; level 24, profile [−8, +8]; residuals −2, −2, +2, +2, 0 → RSS 16, df 3.
    // Level prior: mean (16 + 24)/2 = 20, variance ((−4)² + 4²)/1 = 32.
    // Slot 0: mean (−5 − 8)/2 = −6.5, variance (1.5² + 1.5²)/1 = 4.5; slot 1: mean 6.5, variance 4.5.
    // Noise variance (4 + 16)/(2 + 3) = 4.
    const prior = peerProfilePrior([{ values: [10, 20, 12, 22] }, { values: [30, 14, 34, 18, 32], offset: 1 }], { period: 2 });
    expect(prior.level).toEqual({ mean: 20, variance: 32 });
    expect(prior.profile).toEqual([
      { mean: -6.5, variance: 4.5 },
      { mean: 6.5, variance: 4.5 },
    ]);
    expect(prior.noiseVariance).toBe(4);
    expect(prior.peers).toBe(2);
  });

  it('refuses short peers, bad offsets and single peers', () => {
    expect(() => peerProfilePrior([{ values: [1, 2] }, { values: [1, 2, 3] }], { period: 2 })).toThrowError(/more than one cycle/);
    expect(() => peerProfilePrior([{ values: [1, 2, 3], offset: 2 }, { values: [1, 2, 3] }], { period: 2 })).toThrowError(
      expect.objectContaining({ code: 'invalid-argument' }),
    );
    expect(() => peerProfilePrior([{ values: [1, 2, 3] }], { period: 2 })).toThrowError(
      expect.objectContaining({ code: 'too-few-observations' }),
    );
  });
});
