import { describe, expect, it } from 'vitest';
import { hampelOutliers } from './hampel-spikes';

const daily = (h: number) => 500 + 120 * Math.sin((2 * Math.PI * h) / 24) + 7 * Math.cos(h);

describe('hampelOutliers', () => {
  it('flags a ×5 reading on a daily load cycle and nothing else', () => {
    const values = Float64Array.from({ length: 96 }, (_, h) => (h === 30 ? daily(h) * 5 : daily(h)));
    expect(hampelOutliers(values, 96)).toEqual([30]);
  });

  it('leaves an undisturbed daily cycle alone', () => {
    const values = Float64Array.from({ length: 24 * 14 }, (_, h) => daily(h));
    expect(hampelOutliers(values, values.length)).toEqual([]);
  });

  it('matches the definition on a hand-worked window: median 12, MAD 1, threshold 4 × 1.4826 = 5.93', () => {
    // Window of all 9 readings (h = 4): sorted 10 11 11 12 12 12 13 13 18 → median 12; |x − 12| sorted 0 0 0 1 1 1 1 2 6 → MAD 1.
    const values = Float64Array.from([12, 11, 13, 12, 18, 12, 11, 13, 10]);
    expect(hampelOutliers(values, 9, { halfWindow: 4, k: 4 })).toEqual([4]);
    // 17.9 − 12 = 5.9 < 5.9304: not flagged.
    values[4] = 17.9;
    expect(hampelOutliers(values, 9, { halfWindow: 4, k: 4 })).toEqual([]);
  });

  it('judges only full windows: the first and last h readings are left alone', () => {
    const values = Float64Array.from({ length: 40 }, (_, h) => daily(h));
    values[2] = 1e6;
    values[37] = 1e6;
    values[20] = 1e6;
    expect(hampelOutliers(values, 40)).toEqual([20]);
  });

  it('does not judge a window whose MAD is zero (a flat stretch)', () => {
    const values = new Float64Array(30).fill(7);
    values[15] = 8;
    expect(hampelOutliers(values, 30)).toEqual([]);
  });
});
