import { describe, expect, it } from 'vitest';
import { autoResolution } from './history-service';

const dayMs = 86_400_000;

describe('autoResolution', () => {
  it('aggregates by local day above 60 days', () => {
    expect(autoResolution(60 * dayMs, 60)).toBe('interval');
    expect(autoResolution(60 * dayMs + 1, 60)).toBe('day');
    expect(autoResolution(730 * dayMs, 1440)).toBe('day');
  });

  it('aggregates sub-hourly series by hour above 10,000 intervals', () => {
    // 5-minute readings: 34.7 days is exactly 10,000 intervals.
    expect(autoResolution(10_000 * 5 * 60_000, 5)).toBe('interval');
    expect(autoResolution(40 * dayMs, 5)).toBe('hour');
    expect(autoResolution(40 * dayMs, 15)).toBe('interval');
  });
});
