import { describe, expect, it } from 'vitest';
import { seasonalNaiveAt, seasonalNaiveScale } from './seasonal-naive-scale';

const hourMs = 3_600_000;
const origin = Date.parse('2026-11-02T00:00:00Z');

/** Hourly actuals over the five weeks before the origin, the value of each hour given by its week (1 = the oldest). */
function fiveWeeks(valueOf: (week: number, hourOfWeek: number) => number): Map<number, number> {
  const actuals = new Map<number, number>();
  for (let i = 0; i < 5 * 168; i++) actuals.set(origin - (5 * 168 - i) * hourMs, valueOf(Math.floor(i / 168) + 1, i % 168));
  return actuals;
}

describe('seasonalNaiveScale (MASE scale, Hyndman & Koehler 2006 §3, m = 168)', () => {
  it('is the mean |y_t − y_{t−168}| over the four weeks before the origin', () => {
    // Each week is 10 above the one before: every pair differs by 10, so Q = 10.
    expect(
      seasonalNaiveScale(
        fiveWeeks((week) => 10 * week),
        origin,
      ),
    ).toBeCloseTo(10, 12);
    // Weeks alternate 0, 6, 0, 6, 0 on even hours of the week and stay 0 on odd ones: Q = (6 + 0) / 2 = 3.
    expect(
      seasonalNaiveScale(
        fiveWeeks((week, h) => (h % 2 === 0 && week % 2 === 0 ? 6 : 0)),
        origin,
      ),
    ).toBeCloseTo(3, 12);
  });

  it('skips pairs with a missing actual, and gives null with under a week of pairs or a flat history', () => {
    const gappy = fiveWeeks((week) => 10 * week);
    gappy.delete(origin - 3 * hourMs);
    expect(seasonalNaiveScale(gappy, origin)).toBeCloseTo(10, 12);
    const short = new Map([...gappy].filter(([t]) => t >= origin - 300 * hourMs));
    expect(seasonalNaiveScale(short, origin)).toBeNull();
    expect(
      seasonalNaiveScale(
        fiveWeeks(() => 7),
        origin,
      ),
    ).toBeNull();
  });
});

describe('seasonalNaiveAt (FPP3 §5.2)', () => {
  it('takes the same hour one week earlier within the first week ahead, two weeks earlier in the second', () => {
    // Known at the origin: the hours 168 and 163 hours before it.
    const actuals = new Map([
      [origin - 168 * hourMs, 1],
      [origin - 163 * hourMs, 2],
      [origin + 5 * hourMs, 99], // after the origin: never a naive value for this version
    ]);
    expect(seasonalNaiveAt(actuals, origin, origin)).toBe(1); // h = 1
    expect(seasonalNaiveAt(actuals, origin, origin + 5 * hourMs)).toBe(2); // h = 6
    expect(seasonalNaiveAt(actuals, origin, origin + 168 * hourMs)).toBe(1); // h = 169: two weeks back
    expect(seasonalNaiveAt(actuals, origin, origin + 173 * hourMs)).toBe(2); // h = 174, not the 99 a week back
    expect(seasonalNaiveAt(actuals, origin, origin + 6 * hourMs)).toBeNull();
  });
});
