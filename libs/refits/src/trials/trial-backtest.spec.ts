import { defaultModelSettings } from '../model-settings';
import { describe, expect, it } from 'vitest';
import { realHourlyLoad, REAL_LOAD_NAME } from '../evaluation/real-load.testing';
import { forecastFromOrigins, scoreSide, trialOrigins } from './trial-backtest';
import type { TrialHistory } from './trial-history';

// Real public hourly demand: PJM East (PJME) metered load, 2002, MW (source in fixtures/reference/data/pjm-east-2002.json).
// The last 70 days of 2002, which end at 23:00 on 31 December (local clock, given as UTC), so the days close at midnight.
const { data } = realHourlyLoad();
const hours = 70 * 24;
const start = data.values.length - hours;
const history: TrialHistory = {
  series: { id: 1, key: 'pjme', name: REAL_LOAD_NAME, unit: 'MW', intervalMinutes: 60, timeZone: 'UTC', temperatureSeriesId: null },
  timestamps: data.timestamps.slice(start),
  values: data.values.slice(start),
  bridgedHours: 0,
  temperature: { usable: false, reason: 'the fixture has no temperatures' },
};
const noTemperature = { enabled: false, heatingBase: null, coolingBase: null };

describe(`one side of a settings trial on ${REAL_LOAD_NAME}`, { timeout: 120_000 }, () => {
  it('puts 14 origins a day apart, the last one a week before the end', () => {
    const origins = trialOrigins(hours);
    expect(origins).toHaveLength(14);
    expect(origins.at(-1)).toBe(hours - 168);
    expect(origins.slice(1).map((o, i) => o - origins[i]!)).toEqual(Array(13).fill(24));
  });

  it('refits once per origin, in order, and scores seasonal naive exactly as the benchmark it is', async () => {
    // Seasonal naive with no seasonal step forecasts the same hour last week: the backtest's own benchmark, so
    // at both horizons its MAE must equal the benchmark's and its MASE the benchmark's MASE (closed form).
    const settings = {
      ...defaultModelSettings,
      method: 'seasonal-naive' as const,
      seasonal: { kind: 'none' as const },
      temperature: noTemperature,
    };
    const fitted: number[] = [];
    const forecasts = await forecastFromOrigins(history, settings, null, async (origin) => {
      fitted.push(origin);
    });
    expect(fitted).toEqual(trialOrigins(hours));
    const side = scoreSide(history, forecasts);
    expect(side.fitted).toEqual({ 'Seasonal naive (same hour last week)': 14 });
    expect(side.temperature).toEqual({ used: false, reason: 'temperature regressors are switched off in these settings' });
    for (const scores of [side.dayAhead, side.weekAhead]) {
      expect(scores.mae).toBeCloseTo(scores.naive.mae, 9);
      expect(scores.mase).toBeCloseTo(scores.naive.mase!, 9);
    }
    // Whole days: one per day-ahead window, seven per week-ahead window.
    expect([side.dayAhead.peakDays, side.weekAhead.peakDays]).toEqual([14, 98]);
  });

  it('scores a fitted model against the same benchmark on the same hours', async () => {
    const settings = { ...defaultModelSettings, method: 'cmle' as const, trainingWindowDays: 42, temperature: noTemperature };
    const naive = { ...settings, method: 'seasonal-naive' as const, seasonal: { kind: 'none' as const } };
    const model = scoreSide(history, await forecastFromOrigins(history, settings, { country: 'US', extraDates: [] }, async () => {}));
    const benchmark = scoreSide(history, await forecastFromOrigins(history, naive, null, async () => {}));
    expect(model.dayAhead.naive).toEqual(benchmark.dayAhead.naive);
    expect(model.weekAhead.naive).toEqual(benchmark.weekAhead.naive);
    // An AR model on an hour-of-week profile beats last week's load a day ahead on this demand (MASE below the naive one).
    expect(model.dayAhead.mase!).toBeLessThan(benchmark.dayAhead.mase!);
  });
});
