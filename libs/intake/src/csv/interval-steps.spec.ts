import { describe, expect, it } from 'vitest';
import { countSteps, judgeInterval } from './interval-steps';

const minute = 60_000;

describe('judgeInterval', () => {
  it('takes the most common step, and a longer whole multiple of it as a gap, not a second interval', () => {
    // Hourly with one 3-hour gap: steps 60 × 4 and 180 × 1.
    const steps = countSteps([0, 60, 120, 300, 360, 420].map((m) => m * minute));
    expect([...steps]).toEqual([
      [60, 4],
      [180, 1],
    ]);
    expect(judgeInterval(steps)).toEqual({ intervalMinutes: 60, otherIntervals: [], mixed: false });
  });

  it('names a shorter step as another interval and calls the file mixed from 5 % of the steps', () => {
    const steps = new Map([
      [60, 90],
      [15, 10],
    ]);
    expect(judgeInterval(steps)).toEqual({ intervalMinutes: 60, otherIntervals: [{ minutes: 15, share: 0.1 }], mixed: true });
    expect(
      judgeInterval(
        new Map([
          [60, 99],
          [15, 1],
        ]),
      ).mixed,
    ).toBe(false);
  });

  it('ignores repeated times and steps beyond a day; nothing to judge gives null', () => {
    expect([...countSteps([0, 0, 15 * minute, 15 * minute])]).toEqual([[15, 1]]);
    expect(judgeInterval(new Map([[2880, 5]]))).toEqual({ intervalMinutes: null, otherIntervals: [], mixed: false });
  });
});
