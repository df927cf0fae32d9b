import { describe, expect, it } from 'vitest';
import { coverageVerdict, hoursText, percentOf, skillShort } from './accuracy-words';

describe('accuracy words', () => {
  it('says skill against the same hour last week plainly', () => {
    expect(skillShort(0.001)).toBe('No better');
    expect(skillShort(null)).toBeNull();
    expect(skillShort(0.123)).toBe('12 % better');
    expect(skillShort(-0.05)).toBe('5 % worse');
    expect(skillShort(0)).toBe('No better');
  });

  it('judges coverage against the nominal level with five points of tolerance', () => {
    expect(coverageVerdict(0.93, 0.95)).toBe('held as promised');
    expect(coverageVerdict(0.7, 0.8)).toContain('too narrow');
    expect(coverageVerdict(0.99, 0.8)).toBe('wider than needed');
  });

  it('writes shares and hours', () => {
    expect(percentOf(0.876)).toBe('88 %');
    expect(percentOf(null)).toBe('—');
    expect(hoursText(1)).toBe('1 hour');
    expect(hoursText(1.25)).toBe('1.3 hours');
  });
});
