import type { MissRule } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { describeRule, fieldsOf, numberOrNull } from './rule-parameters';

const rule = (over: Partial<MissRule>): MissRule => ({
  id: 1,
  name: 'Default: outside band',
  kind: 'outside_band',
  kindName: 'Outside the band',
  watches: 'Actual load outside the forecast band for consecutive hours.',
  thresholdMeaning: null,
  reads: ['hours', 'bandLevel'],
  scope: 'all',
  scopeLevel: null,
  scopeSeriesId: null,
  hours: 3,
  threshold: null,
  bandLevel: 95,
  floorKw: null,
  peakHourTolerance: null,
  severity: 'high',
  recipients: ['role:admin', 'role:planner'],
  active: true,
  ...over,
});

describe('describeRule', () => {
  it('words only the settings the kind reads, then severity and recipients', () => {
    // threshold 12 is stored but outside_band does not read it, so it is not shown.
    expect(describeRule(rule({ threshold: 12 }))).toBe('3 hours in a row; 95 % band; high severity; to role:admin, role:planner');
  });

  it("uses the kind's own words for its threshold and says when no one is e-mailed", () => {
    const peak = rule({
      kind: 'daily_peak_missed',
      reads: ['threshold', 'floorKw', 'peakHourTolerance'],
      thresholdMeaning: 'percent peak error',
      hours: 1,
      threshold: 5,
      bandLevel: null,
      floorKw: 50,
      peakHourTolerance: 2,
      recipients: [],
    });
    expect(describeRule(peak)).toBe('5 percent peak error; floor 50 kW; peak hour ±2; high severity; no e-mail');
    expect(fieldsOf(peak).map((field) => field.key)).toEqual(['threshold', 'floorKw', 'peakHourTolerance']);
  });
});

it('words the tracking signal limit as a bound either side', () => {
  const bias = rule({ kind: 'creeping_bias', reads: ['hours', 'threshold'], thresholdMeaning: 'tracking signal limit', threshold: 4 });
  expect(describeRule(bias)).toBe('3 hours in a row; tracking signal beyond ±4; high severity; to role:admin, role:planner');
});

describe('numberOrNull', () => {
  it('reads typed numbers and leaves empty or unreadable input as null', () => {
    expect(numberOrNull('4')).toBe(4);
    expect(numberOrNull(2.5)).toBe(2.5);
    expect(numberOrNull('')).toBeNull();
    expect(numberOrNull(null)).toBeNull();
    expect(numberOrNull('abc')).toBeNull();
  });
});
