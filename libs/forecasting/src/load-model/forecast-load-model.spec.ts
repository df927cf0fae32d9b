import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { exactArimaForecast } from './exact-arima-forecast';
import { fitLoadModel } from './fit-load-model';
import { forecastLoadModel } from './forecast-load-model';
import type { LoadModelSpec } from './load-model-spec';
import { hourlyTimestamps, seededNormal } from './synthetic-load.testing';

const base: LoadModelSpec = {
  method: 'cmle',
  p: 1,
  q: 0,
  seasonal: { kind: 'difference', lag: 24 },
  log: true,
  temperature: null,
  dayTypes: false,
  holidays: null,
  timeZone: 'America/Chicago',
};

// log load follows a seasonal random walk at lag 24 with AR(1) increments: v_t = v_{t−24} + u_t,
// u_t = 0.6 u_{t−1} + e_t, e_t ~ N(0, 0.02²); 8 weeks of hours, seeded.
const phi = 0.6;
const sigma = 0.02;
const n = 8 * 168;
const normal = seededNormal(5);
const v = new Float64Array(n);
const u = new Float64Array(n);
for (let t = 0; t < n; t++) {
  u[t] = (t > 0 ? phi * u[t - 1] : 0) + sigma * normal();
  v[t] = t < 24 ? Math.log(500 + 150 * Math.sin((2 * Math.PI * (t - 9)) / 24)) : v[t - 24] + u[t];
}
const timestamps = hourlyTimestamps('2024-01-01T06:00:00Z', n);
const data = { timestamps, values: Float64Array.from(v, Math.exp) };

describe('forecastLoadModel with log transform and seasonal differencing', () => {
  const model = fitLoadModel(base, data);
  const horizon = 48;
  const f = forecastLoadModel(model, {}, horizon, [80, 95]);

  it('reassembles differencing exactly as the state-space forecaster on the log scale', () => {
    // Independent route: Kalman filter with the differencing in the state (exact-arima-forecast.ts, checked
    // against R predict). For a pure AR part the conditional and exact forecasts coincide.
    const exact = exactArimaForecast(model.arma!, model.transformed, 24, horizon);
    for (let h = 0; h < horizon; h++) {
      expect(Math.log(f.median[h])).toBeCloseTo(exact.mean[h], 10);
      // Lognormal sd ⇒ the log-scale se: s² = log(1 + (se/mean)²).
      expect(Math.sqrt(Math.log1p((f.se[h] / f.mean[h]) ** 2))).toBeCloseTo(exact.se[h], 10);
    }
  });

  it('returns the bias-adjusted mean, the median and intervals back-transformed by quantile', () => {
    const exact = exactArimaForecast(model.arma!, model.transformed, 24, horizon);
    const i95 = f.intervals.find((i) => i.level === 95)!;
    for (const h of [0, 30]) {
      const s = exact.se[h];
      expect(f.mean[h]).toBeCloseTo(Math.exp(exact.mean[h] + (s * s) / 2), 8);
      expect(i95.lower[h]).toBeCloseTo(Math.exp(exact.mean[h] - 1.959963984540054 * s), 8);
      expect(i95.upper[h]).toBeCloseTo(Math.exp(exact.mean[h] + 1.959963984540054 * s), 8);
      expect(f.median[h]).toBeLessThan(f.mean[h]);
    }
  });

  it('covers about 95 % of simulated future paths and matches their mean', () => {
    // 2000 continuations of the true process: binomial sd of 0.95 coverage ≈ 0.0049, tolerance 0.02 ≈ 4 sd.
    const paths = 2000;
    const sim = seededNormal(99);
    const i95 = f.intervals.find((i) => i.level === 95)!;
    const covered = new Float64Array(horizon);
    const sum = new Float64Array(horizon);
    const sumSq = new Float64Array(horizon);
    for (let path = 0; path < paths; path++) {
      const future = new Float64Array(horizon);
      let prev = u[n - 1];
      for (let h = 0; h < horizon; h++) {
        prev = phi * prev + sigma * sim();
        future[h] = (h < 24 ? v[n - 24 + h] : future[h - 24]) + prev;
        const y = Math.exp(future[h]);
        if (y >= i95.lower[h] && y <= i95.upper[h]) covered[h]++;
        sum[h] += y;
        sumSq[h] += y * y;
      }
    }
    for (const h of [0, 11, 23, 47]) {
      expect(Math.abs(covered[h] / paths - 0.95), `coverage h = ${h + 1}`).toBeLessThan(0.02);
      const mcMean = sum[h] / paths;
      const mcSe = Math.sqrt((sumSq[h] / paths - mcMean * mcMean) / paths);
      // Monte-Carlo error 4 sd, plus the drift and φ estimation error (a few 1e-3 relative over 48 h).
      expect(Math.abs(f.mean[h] - mcMean), `mean h = ${h + 1}`).toBeLessThan(4 * mcSe + 0.005 * mcMean);
    }
  });
});

describe('forecastLoadModel on local-time slots across daylight saving', () => {
  // Noiseless-but-for-a-whisper load equal to 100·(local hour + 1): the additive hour-of-day profile is
  // the hour itself, so each forecast reveals the slot it was assigned.
  const start = '2024-10-01T05:00:00Z';
  const fitAndForecast = (timeZone: string) => {
    const ts = hourlyTimestamps(start, 33 * 24); // ends 2 November 2024, 23:00 CDT
    const hours = new Intl.DateTimeFormat('en-US', { timeZone, hour: '2-digit', hourCycle: 'h23' });
    const jitter = seededNormal(1);
    const values = Float64Array.from(ts, (ms) => 100 * (Number(hours.format(ms)) + 1) + 0.01 * jitter());
    const spec: LoadModelSpec = { ...base, log: false, seasonal: { kind: 'profile', period: 24, form: 'additive' }, timeZone };
    return forecastLoadModel(fitLoadModel(spec, { timestamps: ts, values }), {}, 30, [95]);
  };

  it('gives the repeated fall-back hour in America/Chicago the slot of 01:00 twice', () => {
    const f = fitAndForecast('America/Chicago');
    // Forecast hours from 00:00 CDT on 3 November: 00, 01 (CDT), 01 (CST), 02, 03, …
    const slotOf = (h: number) => Math.round(f.mean[h] / 100) - 1;
    expect([0, 1, 2, 3, 4].map(slotOf)).toEqual([0, 1, 1, 2, 3]);
  });

  it('keeps 24 distinct hours in America/Phoenix over the same instants', () => {
    const f = fitAndForecast('America/Phoenix');
    const slotOf = (h: number) => Math.round(f.mean[h] / 100) - 1;
    // Phoenix (UTC−7): the same UTC hours are 22:00, 23:00, 00:00, 01:00, 02:00 local.
    expect([0, 1, 2, 3, 4].map(slotOf)).toEqual([22, 23, 0, 1, 2]);
  });
});

describe('seasonal naive as a method', () => {
  const spec: LoadModelSpec = { ...base, method: 'seasonal-naive', log: false, seasonal: { kind: 'difference', lag: 24 } };
  const model = fitLoadModel(spec, data);

  it('repeats the value one period back with se σ̂√(k + 1), σ̂² the in-sample mean squared error', () => {
    const f = forecastLoadModel(model, {}, 50, [95]);
    const y = data.values;
    let sumSq = 0;
    for (let t = 24; t < n; t++) sumSq += (y[t] - y[t - 24]) ** 2;
    const sigma2 = sumSq / (n - 24);
    expect(f.mean[0]).toBe(y[n - 24]);
    expect(f.mean[23]).toBe(y[n - 1]);
    expect(f.mean[24]).toBe(y[n - 24]);
    expect(f.mean[49]).toBe(y[n - 23]); // h = 50: k = 2, two periods back from h = 2
    expect(f.se[0]).toBeCloseTo(Math.sqrt(sigma2), 12);
    expect(f.se[24]).toBeCloseTo(Math.sqrt(2 * sigma2), 12);
    expect(f.se[48]).toBeCloseTo(Math.sqrt(3 * sigma2), 12);
  });

  it('refuses regressors it cannot use', () => {
    expect(() => fitLoadModel({ ...spec, dayTypes: true }, data)).toThrow(ForecastingError);
  });
});

describe('input checks', () => {
  it('refuses gaps in the hourly timestamps and a bad horizon', () => {
    const ts = Float64Array.from(timestamps);
    ts[10] += 1000;
    expect(() => fitLoadModel(base, { timestamps: ts, values: data.values })).toThrow(/hourly/);
    const model = fitLoadModel({ ...base, log: false }, data);
    expect(() => forecastLoadModel(model, {}, 0, [95])).toThrow(/horizon/);
  });

  it('asks for future temperatures when the model uses them', () => {
    const temperature = Float64Array.from(timestamps, (_, t) => 10 + 10 * Math.sin(t / 50));
    const model = fitLoadModel({ ...base, log: false, temperature: { heatingBase: 15.5, coolingBase: 22 } }, { ...data, temperature });
    expect(() => forecastLoadModel(model, {}, 24, [95])).toThrow(/temperature/);
  });
});
