import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fitLoadModel, forecastLoadModel, simulateArma, type LoadModelSpec } from '@loadwright/forecasting';
import { maxRelativeDifference, runLoadwright } from './run-command.spec-support';

// A synthetic hourly load with known structure: level 100, a daily sine of amplitude 20, heating response
// 1.5 per degree-hour below 15.5 °C, AR(1) noise φ = 0.8, σ² = 4 (core/simulate-arma.ts, seed 5). Six weeks
// observed, then 48 hours with temperature only (the forecast hours). Temperature has a 9.3-day swing so the
// degree-hours are not a function of the hour of day.
const observed = 24 * 7 * 6;
const future = 48;
const start = Date.UTC(2026, 0, 5, 6);
const noise = simulateArma({ mean: 0, ar: [0.8], ma: [], sigma2: 4 }, observed + future, 5);
const temperature = Array.from(
  { length: observed + future },
  (_, t) => 5 + 8 * Math.sin((2 * Math.PI * (t - 8)) / 24) + 6 * Math.sin((2 * Math.PI * t) / (24 * 9.3)),
);
const load = temperature.map((temp, t) => 100 + 20 * Math.sin((2 * Math.PI * (t - 6)) / 24) + 1.5 * Math.max(0, 15.5 - temp) + noise[t]);
const csv = [
  'timestamp,value,temp',
  ...temperature.map((temp, t) => `${new Date(start + t * 3_600_000).toISOString()},${t < observed ? load[t] : ''},${temp}`),
].join('\n');
const file = join(mkdtempSync(join(tmpdir(), 'loadwright-load-')), 'load.csv');
writeFileSync(file, csv);

const spec: LoadModelSpec = {
  method: 'cmle',
  p: 2,
  q: 0,
  seasonal: { kind: 'profile', period: 24, form: 'additive' },
  log: false,
  temperature: { heatingBase: 15.5, coolingBase: 22 },
  dayTypes: false,
  holidays: null,
  timeZone: 'UTC',
};
const args = [
  'forecast',
  '--method',
  'cmle',
  '--p',
  '2',
  '--seasonal',
  'profile',
  '--period',
  '24',
  '--temperature-column',
  'temp',
  '--horizon',
  '48',
  '--input',
  file,
];

describe('loadwright forecast with seasonal and temperature options', { timeout: 60_000 }, () => {
  it('prints what the engine load-model pipeline gives for the same spec and data, with timestamps', () => {
    const run = runLoadwright(args);
    expect(run.status, run.stderr).toBe(0);
    const out = JSON.parse(run.stdout);
    const model = fitLoadModel(spec, {
      timestamps: Float64Array.from({ length: observed }, (_, t) => start + t * 3_600_000),
      values: Float64Array.from(load.slice(0, observed)),
      temperature: Float64Array.from(temperature.slice(0, observed)),
    });
    const expected = forecastLoadModel(model, { temperature: Float64Array.from(temperature.slice(observed)) }, 48, [80, 95]);
    // The CSV carries the values as JavaScript prints them (shortest round-trip), so both runs see the same doubles.
    expect(maxRelativeDifference(out.mean, Array.from(expected.mean))).toBeLessThan(1e-12);
    expect(maxRelativeDifference(out.intervals['95'].upper, Array.from(expected.intervals[1].upper))).toBeLessThan(1e-12);
    expect(out.timestamps[0]).toBe(new Date(start + observed * 3_600_000).toISOString());
    expect(out.timestamps).toHaveLength(48);
    expect(out.loadModel.seasonal).toEqual({ kind: 'profile', period: 24, form: 'additive' });
  });

  it('recovers the simulated heating response and AR coefficient within 3 standard errors', () => {
    const out = JSON.parse(runLoadwright(args).stdout);
    const heating = out.loadModel.regression.names.indexOf('heating-degree-hours');
    expect(Math.abs(out.loadModel.regression.coefficients[heating] - 1.5)).toBeLessThan(3 * out.loadModel.regression.stderr[heating]);
    expect(Math.abs(out.fit.ar[0] - 0.8)).toBeLessThan(3 * out.fit.stderr.ar[0]);
  });

  it('exits 2 when the forecast hours lack temperatures, and when the input has no timestamps', () => {
    const short = runLoadwright([...args.slice(0, -4), '--horizon', '72', '--input', file]);
    expect(short.status).toBe(2);
    expect(short.stderr).toMatch(/add 72 rows after the last observation/);
    const json = runLoadwright(['fit', '--method', 'cmle', '--p', '1', '--seasonal', 'profile', '--period', '24'], '[1, 2, 3, 4]');
    expect(json.status).toBe(2);
    expect(json.stderr).toMatch(/need CSV input with an hourly "timestamp" column/);
  });

  it('backtests the pipeline: 3 day-ahead windows of 48 hours beat seasonal naive and report daily peaks', () => {
    // Observed rows only (the forecast hours have no actuals to score).
    const observedFile = join(mkdtempSync(join(tmpdir(), 'loadwright-load-')), 'observed.csv');
    writeFileSync(
      observedFile,
      csv
        .split('\n')
        .slice(0, observed + 1)
        .join('\n'),
    );
    const run = runLoadwright([
      'backtest',
      ...args.slice(1, -4),
      '--horizon',
      '48',
      '--origins',
      '3',
      '--season',
      '24',
      '--input',
      observedFile,
    ]);
    expect(run.status, run.stderr).toBe(0);
    const out = JSON.parse(run.stdout);
    expect(out.origins).toEqual([observed - 144, observed - 96, observed - 48]);
    expect(out.weather).toBe('observed');
    // The simulated load has AR(1) noise with φ = 0.8 and a temperature response that seasonal naive cannot follow.
    expect(out.overall.skill.mae).toBeGreaterThan(0);
    // Series start at 06:00 UTC, so each 48-hour window holds one whole UTC day.
    expect(out.peak.days).toBe(3);
  });
});
