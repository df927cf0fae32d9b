import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { lhReference, lhValues, maxRelativeDifference, runLoadwright } from './run-command.spec-support';

// End-to-end: each test starts the real command (node apps/cli/bin/loadwright.mjs, TypeScript through tsx) on the lh
// series (R datasets::lh, fixtures/reference/data/lh.json) and checks its JSON against R 4.2.2 values stored in
// fixtures/reference/ref/lh.json, each with the R call that produced it. A process start costs about a second.
const lhJson = JSON.stringify(lhValues());
const lhCsv = `timestamp,value\n${lhValues()
  .map((v, i) => `${new Date(Date.UTC(2026, 0, 1, i)).toISOString()},${v}`)
  .join('\n')}\n`;
const reference = lhReference();

describe('loadwright fit', { timeout: 60_000 }, () => {
  it('cmle AR(2) from a JSON array on stdin matches R lm on lagged values (ols["2"].lm_ols) to 1e-8', () => {
    const run = runLoadwright(['fit', '--method', 'cmle', '--p', '2'], lhJson);
    expect(run.status, run.stderr).toBe(0);
    const fit = JSON.parse(run.stdout);
    const lm = reference.ols['2'].lm_ols;
    expect(Object.keys(fit)).toEqual([
      'method',
      'p',
      'q',
      'n',
      'mean',
      'ar',
      'ma',
      'sigma2',
      'stderr',
      'loglik',
      'aic',
      'bic',
      'converged',
      'iterations',
      'warnings',
    ]);
    expect(maxRelativeDifference(fit.ar, lm.ar)).toBeLessThan(1e-8);
    expect(
      maxRelativeDifference([fit.mean, fit.sigma2, fit.loglik], [lm.implied_mean, lm.sigma2_divisor_n_minus_p, lm.cond_loglik_at_mle]),
    ).toBeLessThan(1e-8);
    expect(maxRelativeDifference(fit.stderr.ar, lm.coef_se_unbiased.slice(1))).toBeLessThan(1e-8);
    expect([fit.converged, fit.iterations, fit.n, fit.q]).toEqual([null, null, 48, 0]);
  });

  it('yule-walker AR(3) from a CSV file with timestamps matches R ar.yw (yule_walker["3"]) to 1e-8', () => {
    const file = join(mkdtempSync(join(tmpdir(), 'loadwright-')), 'lh.csv');
    writeFileSync(file, lhCsv);
    const run = runLoadwright(['fit', '--method', 'yule-walker', '--p', '3', '--input', file]);
    expect(run.status, run.stderr).toBe(0);
    const fit = JSON.parse(run.stdout);
    const yw = reference.yule_walker['3'];
    expect(maxRelativeDifference(fit.ar, yw.ar)).toBeLessThan(1e-8);
    expect(maxRelativeDifference([fit.sigma2, fit.mean], [yw.var_innov_levinson_plain, yw.x_mean])).toBeLessThan(1e-8);
  });
});

describe('loadwright forecast', { timeout: 60_000 }, () => {
  it('nls ARMA(1,1) forecasts match R predict() on the CSS fit (forecasts.arma11_css) to 1e-4, with 80 and 95 % intervals', () => {
    // Our NLS and R's CSS optimiser stop at slightly different points (README convention 7), hence the agreed 1e-4.
    const run = runLoadwright(['forecast', '--method', 'nls', '--p', '1', '--q', '1', '--horizon', '24'], lhJson);
    expect(run.status, run.stderr).toBe(0);
    const out = JSON.parse(run.stdout);
    const r = reference.forecasts.arma11_css;
    expect(maxRelativeDifference(out.mean, r.mean)).toBeLessThan(1e-4);
    expect(maxRelativeDifference(out.se, r.se)).toBeLessThan(1e-4);
    expect(Object.keys(out.intervals)).toEqual(['80', '95']);
    expect(maxRelativeDifference(out.intervals['95'].lower, r.lower95)).toBeLessThan(1e-4);
    expect(maxRelativeDifference(out.intervals['80'].upper, r.upper80)).toBeLessThan(1e-4);
    expect(out.fit.method).toBe('nls');
  });
});

describe('loadwright select', { timeout: 60_000 }, () => {
  it('yule-walker by AIC picks AR(3) on lh, as R ar(x, method = "yule-walker") does (yule_walker_aic_selection)', () => {
    const run = runLoadwright(['select', '--method', 'yule-walker', '--max-p', '8', '--criterion', 'aic'], lhJson);
    expect(run.status, run.stderr).toBe(0);
    const out = JSON.parse(run.stdout);
    expect(out.best.p).toBe(reference.yule_walker_aic_selection.order_selected);
    expect(out.table[0].p).toBe(3);
    // Ranked best first.
    const aics = out.table.map((row: { aic: number }) => row.aic);
    expect([...aics].sort((a, b) => a - b)).toEqual(aics);
  });
});

describe('loadwright backtest', { timeout: 60_000 }, () => {
  it('reports overall and per-horizon metrics for 4 origins × 3 steps with a seasonal-naive benchmark', () => {
    const run = runLoadwright(['backtest', '--method', 'cmle', '--p', '1', '--horizon', '3', '--origins', '4'], lhJson);
    expect(run.status, run.stderr).toBe(0);
    const out = JSON.parse(run.stdout);
    // Origins step by the horizon and end so the last forecast reaches the last observation: 36, 39, 42, 45.
    expect(out.origins).toEqual([36, 39, 42, 45]);
    expect(out.perHorizon.map((row: { h: number }) => row.h)).toEqual([1, 2, 3]);
    expect(out.overall.count).toBe(12);
    expect(out.overall.rmse).toBeGreaterThanOrEqual(out.overall.mae);
    expect(out.overall.intervals.map((i: { level: number }) => i.level)).toEqual([80, 95]);
  });
});

describe('loadwright on bad input', { timeout: 120_000 }, () => {
  const cases: Array<[string, string[], string, RegExp]> = [
    ['a non-numeric value', ['fit', '--method', 'cmle', '--p', '1'], 'value\n1.2\nabc\n2.0\n', /line 3 has value "abc"/],
    ['several columns and none named value', ['fit', '--method', 'cmle', '--p', '1'], 'a,b\n1,2\n3,4\n', /no "value" column/],
    ['a CSV without a header', ['fit', '--method', 'cmle', '--p', '1'], '1.5\n2.5\n3.5\n', /needs a header row/],
    ['empty input', ['fit', '--method', 'cmle', '--p', '1'], '', /is empty/],
    ['an unknown method', ['fit', '--method', 'magic', '--p', '1'], lhJson, /--method must be one of/],
    ['an unknown option', ['fit', '--method', 'cmle', '--p', '1', '--colour', 'red'], lhJson, /Unknown option '--colour'/],
    ['a constant series', ['fit', '--method', 'yule-walker', '--p', '1'], '[5, 5, 5, 5, 5, 5]', /constant/],
    ['a missing horizon', ['forecast', '--method', 'cmle', '--p', '1'], lhJson, /--horizon is required/],
  ];
  for (const [what, args, stdin, message] of cases) {
    it(`exits 2 with one line on stderr for ${what}`, () => {
      const run = runLoadwright(args, stdin);
      expect(run.status).toBe(2);
      expect(run.stdout).toBe('');
      expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(run.stderr).toMatch(/^loadwright \w+: /);
      expect(run.stderr).toMatch(message);
    });
  }
});
