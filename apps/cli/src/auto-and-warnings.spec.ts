import { readFileSync } from 'node:fs';
import { defaultModelSettings, fitSeriesModel, type RefitInputs } from '@loadwright/refits';
import { describe, expect, it } from 'vitest';
import { feederLoad, stationTemperatures } from '../../../bench/refit/synthetic-fleet';
import { runLoadwright } from './run-command.spec-support';

// `--method auto` must be the refit: the same hours through fitSeriesModel with the refit's default settings
// (defaultModelSettings) give the same chosen candidate, mean, standard errors and (calibrated) bands.
describe('loadwright --method auto', { timeout: 300_000 }, () => {
  const startMs = Date.UTC(2025, 0, 6);
  const hours = 24 * 7 * 16;
  const values = feederLoad(3, startMs, hours, stationTemperatures(startMs, hours));
  const timestamps = Float64Array.from({ length: hours }, (_, i) => startMs + i * 3_600_000);
  const csv = `timestamp,value\n${Array.from(values, (v, i) => `${new Date(timestamps[i]).toISOString()},${v}`).join('\n')}\n`;

  it('forecasts exactly what the refit forecasts for the same hours and defaults, and names the chosen candidate', () => {
    const run = runLoadwright(
      ['forecast', '--method', 'auto', '--horizon', '168', '--holidays', 'US', '--time-zone', 'America/Chicago'],
      csv,
    );
    expect(run.status, run.stderr).toBe(0);
    const printed = JSON.parse(run.stdout);
    const inputs: RefitInputs = {
      series: { id: 0, key: 'input', name: 'input', unit: '', intervalMinutes: 60, timeZone: 'America/Chicago', temperatureSeriesId: null },
      settings: defaultModelSettings,
      window: { timestamps, values, bridgedHours: 0 },
      temperature: { usable: false, station: null, reason: 'none', fallback: false },
    };
    const refit = fitSeriesModel(inputs, { country: 'US', extraDates: [] });
    const chosen = refit.selection!.candidates.find((c) => c.chosen)!;
    expect(printed.method).toBe('auto');
    expect(printed.chosen).toBe(chosen.label);
    expect(printed.fittedMethod).toBe(refit.method);
    expect(printed.mean).toEqual(Array.from(refit.forecast.mean));
    expect(printed.se).toEqual(Array.from(refit.forecast.se));
    for (const band of refit.forecast.intervals) {
      expect(printed.intervals[String(band.level)]).toEqual({ lower: Array.from(band.lower), upper: Array.from(band.upper) });
    }
    expect(printed.bands).toEqual(refit.bands);
    expect(Object.keys(printed)).toEqual(expect.arrayContaining(['timestamps', 'mean', 'se', 'intervals', 'selection', 'warnings']));
  });

  it('backtests the refit itself: each origin runs the same choice on the hours before it', () => {
    const run = runLoadwright(
      ['backtest', '--method', 'auto', '--horizon', '24', '--origins', '2', '--step', '24', '--holidays', 'US'],
      csv,
    );
    expect(run.status, run.stderr).toBe(0);
    const result = JSON.parse(run.stdout);
    expect(result.method).toBe('auto');
    expect(result.chosen).toHaveLength(2);
    expect(result.overall).toBeTruthy();
  });

  it('refuses orders it chooses itself', () => {
    const run = runLoadwright(['fit', '--method', 'auto', '--p', '2'], csv);
    expect(run.status).toBe(2);
    expect(run.stderr).toMatch(/--p does not apply to --method auto/);
  });
});

// R datasets::UKgas (quarterly UK gas consumption 1960–1986, fixtures/reference/data/UKgas.json): its log trends from
// 4.4 to 7.1, and ARMA(1,1) by nonlinear least squares walks to φ ≈ 0.99999 with a mean far outside the data.
describe('loadwright on a trending series', { timeout: 120_000 }, () => {
  const logged = JSON.stringify(
    (JSON.parse(readFileSync(new URL('../../../fixtures/reference/data/UKgas.json', import.meta.url), 'utf8')).values as number[]).map(
      Math.log,
    ),
  );

  it('fit prints a warnings array with the near-unit root and the suggestion to difference', () => {
    const run = runLoadwright(['fit', '--method', 'nls', '--p', '1', '--q', '1'], logged);
    expect(run.status, run.stderr).toBe(0);
    const fit = JSON.parse(run.stdout);
    const codes = fit.warnings.map((w: { code: string }) => w.code);
    expect(codes).toContain('near-unit-root');
    expect(codes).toContain('mean-outside-data');
    expect(fit.warnings[0].suggestion).toMatch(/[Dd]ifference the series/);
  });

  it('forecast refuses the fit that did not converge, and gives it with --accept-unconverged', () => {
    const fit = JSON.parse(runLoadwright(['fit', '--method', 'nls', '--p', '1', '--q', '1'], logged).stdout);
    const refused = runLoadwright(['forecast', '--method', 'nls', '--p', '1', '--q', '1', '--horizon', '4'], logged);
    const accepted = runLoadwright(
      ['forecast', '--method', 'nls', '--p', '1', '--q', '1', '--horizon', '4', '--accept-unconverged'],
      logged,
    );
    expect(accepted.status, accepted.stderr).toBe(0);
    expect(JSON.parse(accepted.stdout).warnings.length).toBeGreaterThan(0);
    // 200 Levenberg-Marquardt steps along the unit-root ridge end without convergence (nls.ts, maxIterations).
    expect(fit.converged).toBe(false);
    expect(refused.status).toBe(2);
    expect(refused.stderr).toMatch(/did not converge.*--accept-unconverged/);
  });
});
