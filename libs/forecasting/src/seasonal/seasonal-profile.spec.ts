import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { estimateSeasonalProfile, removeSeasonalProfile, restoreSeasonalProfile } from './seasonal-profile';

// A noiseless hour-of-day pattern: every slot mean is known exactly, so the estimates must match to
// rounding (1e-12).
const days = 10;
const slots = Uint8Array.from({ length: days * 24 }, (_, i) => i % 24);
const pattern = (h: number) => 100 + 20 * Math.sin((2 * Math.PI * h) / 24);

describe('estimateSeasonalProfile', () => {
  it('recovers an additive hour-of-day profile as slot mean − overall mean', () => {
    const values = Float64Array.from(slots, (h) => pattern(h));
    const profile = estimateSeasonalProfile(values, slots, 'hour-of-day', 'additive');
    expect(profile.level).toBeCloseTo(100, 12);
    for (let h = 0; h < 24; h++) expect(profile.effect[h]).toBeCloseTo(pattern(h) - 100, 10);
    const remainder = removeSeasonalProfile(profile, values, slots);
    for (const r of remainder) expect(r).toBeCloseTo(100, 10);
    const back = restoreSeasonalProfile(profile, remainder, slots);
    back.forEach((v, i) => expect(v).toBeCloseTo(values[i], 10));
  });

  it('recovers a multiplicative profile as the ratio of slot mean to level', () => {
    const values = Float64Array.from(slots, (h) => pattern(h));
    const profile = estimateSeasonalProfile(values, slots, 'hour-of-day', 'multiplicative');
    for (let h = 0; h < 24; h++) expect(profile.effect[h]).toBeCloseTo(pattern(h) / 100, 12);
    const remainder = removeSeasonalProfile(profile, values, slots);
    for (const r of remainder) expect(r).toBeCloseTo(100, 10);
  });

  it('weights additive effects by slot counts so they average to zero over the data', () => {
    // An extra observation in slot 1 (as on a fall-back day).
    const s = Uint8Array.from([...slots, 1]);
    const values = Float64Array.from(s, (h, i) => pattern(h) + (i % 7));
    const profile = estimateSeasonalProfile(values, s, 'hour-of-day', 'additive');
    let weighted = 0;
    for (let h = 0; h < 24; h++) weighted += profile.effect[h] * profile.count[h];
    expect(Math.abs(weighted)).toBeLessThan(1e-9);
    expect(profile.count[1]).toBe(days + 1);
  });

  it('refuses a slot without observations and non-positive multiplicative means', () => {
    expect(() => estimateSeasonalProfile([1, 2], [0, 1], 'hour-of-day', 'additive')).toThrow(ForecastingError);
    const values = Float64Array.from(slots, (h) => (h === 3 ? -1 : 1));
    expect(() => estimateSeasonalProfile(values, slots, 'hour-of-day', 'multiplicative')).toThrow(/additive/);
  });
});
