import { validationRules } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { detailWords, informationalRules, ruleNames } from './rule-names';

describe('ruleNames', () => {
  it('names every validation rule the contracts list', () => {
    expect(Object.keys(ruleNames).sort()).toEqual([...validationRules].sort());
  });

  it('counts an estimate and a repeated hour placed by order as information, not as problems', () => {
    expect([...informationalRules].sort()).toEqual(['dst_resolved', 'estimated']);
  });
});

describe('detailWords', () => {
  it('spells out keys and rounds limits', () => {
    expect(detailWords({ intervals: 3, estimated: true, robustSigma: 12.3456789, method: 'linear' })).toBe(
      'intervals 3 · estimated yes · robust sigma 12.3457 · method linear',
    );
  });

  it('writes UTC instants the way the report table does', () => {
    expect(detailWords({ until: '2026-12-01T11:00:00.000Z', note: '2026-12-01T11:00:30Z' })).toBe(
      'until 2026-12-01 11:00 UTC · note 2026-12-01T11:00:30Z',
    );
  });
});
