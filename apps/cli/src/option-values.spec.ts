import { describe, expect, it } from 'vitest';
import { choiceOption, integerOption, lagsOption, levelsOption, numberOption } from './option-values';

describe('option values', () => {
  it('parses integers with a minimum and a fallback', () => {
    expect(integerOption('p', '3', 0)).toBe(3);
    expect(integerOption('q', undefined, 0, 0)).toBe(0);
    expect(() => integerOption('p', undefined, 0)).toThrow('--p is required');
    expect(() => integerOption('p', '1.5', 0)).toThrow(/integer ≥ 0/);
    expect(() => integerOption('horizon', '0', 1)).toThrow(/integer ≥ 1/);
  });

  it('parses numbers and choices', () => {
    expect(numberOption('lambda', '0.25', 0)).toBe(0.25);
    expect(numberOption('lambda', undefined, 0)).toBeUndefined();
    expect(() => numberOption('lambda', '-1', 0)).toThrow(/number ≥ 0/);
    expect(() => numberOption('lambda', '', 0)).toThrow(/number ≥ 0/);
    expect(choiceOption('criterion', undefined, ['aic', 'bic'] as const, 'aic')).toBe('aic');
    expect(() => choiceOption('criterion', 'hqc', ['aic', 'bic'] as const)).toThrow(/one of aic, bic/);
  });

  it('parses coverage levels in percent, defaulting to 80 and 95', () => {
    expect(levelsOption(undefined)).toEqual([80, 95]);
    expect(levelsOption('50, 99.5')).toEqual([50, 99.5]);
    expect(() => levelsOption('0.8,0.95x')).toThrow(/percentages/);
    expect(() => levelsOption('100')).toThrow(/percentages/);
  });

  it('expands lag sets with ranges, sorted and without duplicates', () => {
    expect(lagsOption('1-3,168,2')).toEqual([1, 2, 3, 168]);
    expect(() => lagsOption('0-2')).toThrow(/lags ≥ 1/);
    expect(() => lagsOption('5-2')).toThrow(/ranges/);
    expect(() => lagsOption('a')).toThrow(/ranges/);
  });
});
