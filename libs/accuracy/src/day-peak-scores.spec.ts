import { describe, expect, it } from 'vitest';
import { dayPeakScores, summarisePeaks } from './day-peak-scores';
import type { ScoredHour } from './scored-hour';

/** A day of a version: flat 100 actual and 100 forecast, with peaks placed by the test. */
function day(versionId: number, localDate: string, hoursInDay: number, peaks: { actual?: [number, number]; forecast?: [number, number] }) {
  return Array.from({ length: hoursInDay }, (_, localHour): ScoredHour => {
    const actual = peaks.actual?.[0] === localHour ? peaks.actual[1] : 100;
    const forecast = peaks.forecast?.[0] === localHour ? peaks.forecast[1] : 100;
    return {
      versionId,
      ts: new Date(Date.parse(`${localDate}T00:00:00Z`) + localHour * 3_600_000),
      horizon: localHour + 1,
      localDate,
      localHour,
      dayType: 'weekday',
      actual,
      forecast,
      naive: null,
      scale: null,
      lower80: forecast - 1,
      upper80: forecast + 1,
      lower95: forecast - 2,
      upper95: forecast + 2,
    };
  });
}

describe('dayPeakScores (daily peak and peak-hour error, Hong & Fan 2016)', () => {
  const hours = [
    // Actual peak 150 at 18:00, forecast peak 140 at 17:00: peak error 140 − 150 = −10, hour error 17 − 18 = −1.
    ...day(1, '2026-11-02', 24, { actual: [18, 150], forecast: [17, 140] }),
    // Forecast peak 170 at 19:00 against actual 160 at 19:00: +10, hit exactly.
    ...day(1, '2026-11-03', 24, { actual: [19, 160], forecast: [19, 170] }),
    // A 23-hour day (clocks going forward) is left out.
    ...day(2, '2026-03-08', 23, { actual: [18, 150] }),
  ];

  it('scores each whole local day of each version, forecast minus actual', () => {
    const scores = dayPeakScores(hours);
    expect(scores).toEqual([
      {
        versionId: 1,
        localDate: '2026-11-02',
        actualPeak: 150,
        forecastPeak: 140,
        peakError: -10,
        actualHour: 18,
        forecastHour: 17,
        peakHourError: -1,
      },
      {
        versionId: 1,
        localDate: '2026-11-03',
        actualPeak: 160,
        forecastPeak: 170,
        peakError: 10,
        actualHour: 19,
        forecastHour: 19,
        peakHourError: 0,
      },
    ]);
  });

  it('sums them up: mean |peak error| 10, bias 0, mean |hour error| 0.5, one day in two hit exactly', () => {
    expect(summarisePeaks(dayPeakScores(hours))).toEqual({
      days: 2,
      meanAbsolutePeakError: 10,
      meanPeakError: 0,
      meanAbsolutePeakHourError: 0.5,
      exactPeakHourShare: 0.5,
    });
    expect(summarisePeaks([])).toBeNull();
  });
});
