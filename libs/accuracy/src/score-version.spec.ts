import { describe, expect, it } from 'vitest';
import { dayTypeOf } from './day-type';
import { scoreVersion } from './score-version';

const hourMs = 3_600_000;

describe('scoreVersion', () => {
  // Origin 2026-11-27 05:00 UTC = 23:00 on Thursday 26 November in Chicago (UTC−6).
  const origin = new Date('2026-11-27T05:00:00Z');
  const band = (mean: number) => ({ mean, lower80: mean - 5, upper80: mean + 5, lower95: mean - 10, upper95: mean + 10 });
  const hours = [0, 1, 2, 25].map((i) => ({ ts: new Date(origin.getTime() + i * hourMs), ...band(100 + i) }));
  const actuals = new Map([
    [origin.getTime(), 98],
    [origin.getTime() + 1 * hourMs, 103],
    [origin.getTime() + 25 * hourMs, 120],
    [origin.getTime() - 168 * hourMs, 90],
  ]);
  const scored = scoreVersion({ id: 7, origin, horizonHours: 48 }, hours, actuals, {
    timeZone: 'America/Chicago',
    holidays: new Set(['2026-11-26']),
  });

  it('scores only the hours with an actual, with horizon, local day, day type and the naive value of a week before', () => {
    expect(scored.map((h) => [h.horizon, h.localDate, h.localHour, h.dayType, h.actual, h.forecast, h.naive])).toEqual([
      [1, '2026-11-26', 23, 'holiday', 98, 100, 90],
      [2, '2026-11-27', 0, 'weekday', 103, 101, null],
      [26, '2026-11-28', 0, 'weekend', 120, 125, null],
    ]);
    // Too little history before the origin for the MASE scale.
    expect(scored.every((h) => h.scale === null)).toBe(true);
  });

  it('reads day types from the local calendar date: holiday before weekend', () => {
    expect(dayTypeOf('2026-11-28', new Set())).toBe('weekend');
    expect(dayTypeOf('2026-11-29', new Set(['2026-11-29']))).toBe('holiday');
    expect(dayTypeOf('2026-11-30', new Set())).toBe('weekday');
  });
});
