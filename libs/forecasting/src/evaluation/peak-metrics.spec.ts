/**
 * Daily-peak and time-of-peak errors, hand-computed (common practice in load forecasting: peak magnitude and
 * peak timing per day). Exact small numbers, so exact comparisons.
 */
import { describe, expect, it } from 'vitest';
import { dailyPeakError, dailyPeaks, timeOfPeakError } from './peak-metrics';

describe('daily peaks', () => {
  // Four periods a day (6 hours each), two days starting at index 1 (index 0 is the tail of a previous day):
  //   day 1, indices 1..4: actual [5, 9, 7, 6] peak 9 at period 1 → hour 6; forecast [6, 8, 8.5, 5] peak 8.5 at
  //          period 2 → hour 12; peak error 8.5 − 9 = −0.5, hour error 12 − 6 = +6
  //   day 2, indices 5..8: actual [4, 6, 10, 8] peak 10 at period 2 → hour 12; forecast [4, 7, 11, 8] peak 11 at
  //          period 2 → hour 12; peak error +1, hour error 0
  //   index 9 is a partial day and is left out.
  const actual = [100, 5, 9, 7, 6, 4, 6, 10, 8, 50];
  const forecast = [0, 6, 8, 8.5, 5, 4, 7, 11, 8, 0];
  const layout = { periodsPerDay: 4, firstDayStart: 1 };

  it('finds each whole day’s peak and its hour', () => {
    const days = dailyPeaks(actual, forecast, layout);
    expect(days.map((d) => [d.start, d.actualPeak, d.forecastPeak, d.actualHour, d.forecastHour])).toEqual([
      [1, 9, 8.5, 6, 12],
      [5, 10, 11, 12, 12],
    ]);
  });

  it('summarises the peak error', () => {
    const result = dailyPeakError(actual, forecast, layout);
    expect(result.meanError).toBe(0.25); // (−0.5 + 1)/2
    expect(result.meanAbsoluteError).toBe(0.75); // (0.5 + 1)/2
    expect(result.meanAbsolutePercentageError).toBeCloseTo((100 * 0.5) / 9 / 2 + (100 * 1) / 10 / 2, 12); // (5.556 + 10)/2
  });

  it('summarises the time-of-peak error in hours', () => {
    const result = timeOfPeakError(actual, forecast, layout);
    expect(result.meanAbsoluteHours).toBe(3); // (6 + 0)/2
    expect(result.exactShare).toBe(0.5);
  });

  it('gives the earliest period on ties and null percent error on a zero peak', () => {
    const days = dailyPeaks([1, 3, 3, 2], [0, 0, 0, 0], { periodsPerDay: 4 });
    expect(days[0].actualHour).toBe(6);
    expect(days[0].forecastHour).toBe(0);
    expect(dailyPeakError([0, 0, 0, 0], [1, 1, 1, 1], { periodsPerDay: 4 }).meanAbsolutePercentageError).toBeNull();
  });

  it('needs one whole day', () => {
    expect(() => dailyPeaks(new Array(30).fill(1), new Array(30).fill(1), { firstDayStart: 10 })).toThrowError(
      expect.objectContaining({ code: 'too-few-observations' }),
    );
    expect(() => dailyPeaks([1], [1], { periodsPerDay: 24, firstDayStart: 24 })).toThrowError(
      expect.objectContaining({ code: 'invalid-argument' }),
    );
  });
});
