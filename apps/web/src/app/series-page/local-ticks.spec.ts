import { describe, expect, it } from 'vitest';
import { localTicks } from './local-ticks';

const chicago = 'America/Chicago';

describe('localTicks', () => {
  it('puts a week of hourly forecast on each local midnight of the series zone', () => {
    const ticks = localTicks(Date.parse('2026-12-01T00:00:00Z'), Date.parse('2026-12-08T00:00:00Z'), chicago);
    expect(ticks.label).toBe('day');
    // Local midnight in Chicago (UTC−6) is 06:00Z; the first one after the start is 1 Dec.
    expect(ticks.values.map((v) => new Date(v).toISOString())).toEqual([1, 2, 3, 4, 5, 6, 7].map((d) => `2026-12-0${d}T06:00:00.000Z`));
  });

  it('keeps midnights across a clock change (23-hour spring-forward day)', () => {
    const ticks = localTicks(Date.parse('2026-03-07T12:00:00Z'), Date.parse('2026-03-10T12:00:00Z'), chicago);
    expect(ticks.values.map((v) => new Date(v).toISOString())).toEqual([
      '2026-03-08T06:00:00.000Z',
      '2026-03-09T05:00:00.000Z',
      '2026-03-10T05:00:00.000Z',
    ]);
  });

  it('thins out over a month and switches to month starts over a year', () => {
    const month = localTicks(Date.parse('2026-11-01T00:00:00Z'), Date.parse('2026-12-01T00:00:00Z'), chicago);
    expect(month.values.length).toBe(10);
    const year = localTicks(Date.parse('2025-12-01T00:00:00Z'), Date.parse('2026-12-01T00:00:00Z'), chicago);
    expect(year.label).toBe('month');
    expect(year.values.length).toBe(12);
    expect(new Date(year.values[0]!).toISOString()).toBe('2025-12-01T06:00:00.000Z');
  });
});
