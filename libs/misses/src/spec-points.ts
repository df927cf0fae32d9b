/** Hour points for the rule specs: a flat forecast of 100 with a 95 % band of [90, 110] unless given. */
import type { HourPoint } from './hour-point';
import type { RuleSettings } from './rule-kinds';

/** Points one hour apart from `start`, one per actual (null = no actual that hour). */
export function hours(start: string, actuals: (number | null)[], overrides: Partial<HourPoint> = {}): HourPoint[] {
  const t0 = Date.parse(start);
  return actuals.map((actual, i) => ({
    ts: new Date(t0 + i * 3_600_000),
    actual,
    estimated: false,
    forecast: 100,
    stdError: 10 / 1.959963984540054,
    lower80: 93.5,
    upper80: 106.5,
    lower95: 90,
    upper95: 110,
    versionId: 7,
    ...overrides,
  }));
}

/** A rule of `kind` with no parameters set but the ones given. */
export function rule(kind: RuleSettings['kind'], settings: Partial<RuleSettings> = {}): RuleSettings {
  return { kind, hours: 1, threshold: null, bandLevel: null, floorKw: null, peakHourTolerance: null, ...settings };
}
