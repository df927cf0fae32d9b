import type { SeriesReadingStats } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { flaggedCounts, qualitySentence } from './quality-counts';

const stats: SeriesReadingStats = {
  count: 17_520,
  firstAt: '2024-12-01T00:00:00.000Z',
  latestAt: '2026-11-30T23:00:00.000Z',
  byQuality: { estimated: 3, missing: 3, spike: 1, flatLine: 0, negative: 0 },
  clean: 17_513,
};

describe('flaggedCounts', () => {
  it('keeps flags with readings, in bit order, with their labels', () => {
    expect(flaggedCounts(stats)).toEqual([
      { flag: 'estimated', label: 'Estimated', count: 3 },
      { flag: 'missing', label: 'Missing', count: 3 },
      { flag: 'spike', label: 'Spike', count: 1 },
    ]);
  });
});

describe('qualitySentence', () => {
  it('says how many readings are clean and how many carry each flag', () => {
    expect(qualitySentence(stats)).toBe('17,520 readings: 17,513 clean, 3 Estimated, 3 Missing, 1 Spike');
  });

  it('says plainly when a series has no readings yet', () => {
    expect(qualitySentence({ ...stats, count: 0, clean: 0, byQuality: {} })).toBe('No readings stored');
  });
});
