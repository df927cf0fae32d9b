import { describe, expect, it } from 'vitest';
import { rulesInForce, type ScopedRule } from './rules-in-force';

const base = {
  hours: 1,
  threshold: 10,
  bandLevel: null,
  floorKw: null,
  peakHourTolerance: null,
  severity: 'medium' as const,
  recipients: [],
};
const rules: ScopedRule[] = [
  { ...base, id: 1, name: 'default APE', kind: 'error_over_threshold', scope: 'all', scopeLevel: null, scopeSeriesId: null, active: true },
  {
    ...base,
    id: 2,
    name: 'feeders looser',
    kind: 'error_over_threshold',
    scope: 'level',
    scopeLevel: 'feeder',
    scopeSeriesId: null,
    active: true,
    threshold: 20,
  },
  { ...base, id: 3, name: 'F-7 off', kind: 'error_over_threshold', scope: 'series', scopeLevel: null, scopeSeriesId: 7, active: false },
  {
    ...base,
    id: 4,
    name: 'default band',
    kind: 'outside_band',
    scope: 'all',
    scopeLevel: null,
    scopeSeriesId: null,
    active: true,
    bandLevel: 95,
  },
];

describe('rulesInForce', () => {
  it('applies the defaults where nothing overrides them', () => {
    expect(rulesInForce(rules, { id: 1, level: 'system' }).map((r) => r.id)).toEqual([1, 4]);
  });

  it('lets a group (level) override replace the default of its kind', () => {
    expect(rulesInForce(rules, { id: 5, level: 'feeder' }).map((r) => r.id)).toEqual([2, 4]);
  });

  it('lets an inactive series override switch its kind off for that series only', () => {
    expect(rulesInForce(rules, { id: 7, level: 'feeder' }).map((r) => r.id)).toEqual([4]);
  });
});
