// Checks of selectOrder.
// Sources: fixtures/reference/ref/{lh,LakeHuron,USAccDeaths}.json yule_walker_aic_selection
// (R 4.2.2 `ar(x, method = "yule-walker")`: order_selected and aic_absolute = n·log(v_k) + 2k + 2 with
// the plain Levinson-Durbin variance); simulation with a known order (seeded, ../core/simulate-arma.ts).
import { describe, expect, it } from 'vitest';
import { cmleAr } from '../ar/cmle';
import { nlsArma } from '../arma/nls';
import { simulateArma } from '../core/simulate-arma';
import { ForecastingError } from '../core/errors';
import { loadReference, loadSeries, referenceSeries } from '../core/spec-support';
import { selectOrder } from './select-order';

describe('selectOrder with Yule-Walker against R ar()', () => {
  for (const name of referenceSeries) {
    it(`${name}: selects R's order, and its AIC is R's plus n(log 2π + 1) + 2 at every order`, () => {
      const x = loadSeries(name);
      const n = x.length;
      const reference = loadReference(name).yule_walker_aic_selection;
      const selection = selectOrder(x, { method: 'yule-walker', maxP: reference.order_max, criterion: 'aic' });
      expect(selection.best.p).toBe(reference.order_selected);
      expect(selection.best.method).toBe('yule-walker');
      const constant = n * (Math.log(2 * Math.PI) + 1) + 2;
      for (const row of selection.table) {
        // R stores 15 significant digits of values near 1e2–1e3: 1e-9 absolute is rounding level.
        expect(Math.abs(row.aic! - constant - reference.aic_absolute[row.p])).toBeLessThan(1e-9 * Math.max(1, Math.abs(row.aic!)));
      }
    });
  }
});

describe('selectOrder with NLS', () => {
  const x = simulateArma({ mean: 50, ar: [0.7], ma: [0.4], sigma2: 1 }, 1500, 2024);

  it('finds ARMA(1,1) by BIC on a simulated ARMA(1,1), and returns the whole 3 × 3 table ranked', () => {
    const selection = selectOrder(x, { method: 'nls', maxP: 2, maxQ: 2, criterion: 'bic' });
    expect([selection.best.p, selection.best.q]).toEqual([1, 1]);
    expect(selection.table).toHaveLength(9);
    const values = selection.table.filter((row) => row.error === undefined).map((row) => row.bic!);
    expect(values.length).toBeGreaterThanOrEqual(8);
    for (let i = 1; i < values.length; i++) expect(values[i]).toBeGreaterThanOrEqual(values[i - 1]);
    expect(selection.skipped).toEqual([]);
  });

  it('compares candidates on the same residuals, then refits the winner on the whole series', () => {
    const selection = selectOrder(x, { method: 'nls', maxP: 2, maxQ: 1, criterion: 'aic' });
    for (const row of selection.table) if (row.error === undefined) expect(row.nUsed).toBe(x.length - 2);
    const refit = nlsArma(x, selection.best.p, selection.best.q);
    expect(selection.best.n).toBe(x.length);
    expect(selection.best.ar).toEqual(refit.ar);
    expect(selection.best.ma).toEqual(refit.ma);
    const separate = selectOrder(x, { method: 'nls', maxP: 2, maxQ: 1, criterion: 'aic', commonSample: false });
    expect(new Set(separate.table.map((row) => row.nUsed)).size).toBe(3);
  });

  it('stops starting candidates when the budget is spent and lists the rest as skipped', () => {
    // A clock that advances 10 ms per reading: the start reading, then one per candidate.
    let now = 0;
    const clock = () => (now += 10);
    const selection = selectOrder(x, { method: 'nls', maxP: 2, maxQ: 2, criterion: 'aic', budgetMs: 25, clock });
    const fitted = selection.table.filter((row) => !row.skipped);
    expect(fitted.length).toBe(3);
    // Cheapest first: (0,0), then (0,1) and (1,0).
    expect(fitted.map((row) => `${row.p},${row.q}`).sort()).toEqual(['0,0', '0,1', '1,0']);
    expect(selection.skipped).toHaveLength(6);
    expect(selection.table.slice(-6).every((row) => row.skipped && /time budget of 25 ms/.test(row.error!))).toBe(true);
  });
});

describe('selectOrder errors', () => {
  it('records a failed candidate in the table instead of throwing', () => {
    const x = loadSeries('lh').slice(0, 14);
    const selection = selectOrder(x, { method: 'cmle', maxP: 6, criterion: 'aic', commonSample: false });
    const failed = selection.table.filter((row) => row.error !== undefined);
    expect(failed.length).toBeGreaterThan(0);
    expect(failed.every((row) => row.aic === null && /cmleAr/.test(row.error!))).toBe(true);
    expect(selection.best).toEqual(cmleAr(x, selection.best.p));
  });

  it('refuses methods and grids it cannot run', () => {
    const x = loadSeries('lh');
    const code = (run: () => unknown) => {
      try {
        run();
      } catch (error) {
        return error instanceof ForecastingError ? error.code : 'other';
      }
      return 'none';
    };
    expect(code(() => selectOrder(x, { method: 'ridge', maxP: 2, criterion: 'aic' }))).toBe('invalid-argument');
    expect(code(() => selectOrder(x, { method: 'cmle', maxP: 2, maxQ: 1, criterion: 'aic' }))).toBe('invalid-argument');
    expect(code(() => selectOrder(x, { method: 'nls', maxP: -1, criterion: 'aic' }))).toBe('invalid-argument');
    expect(code(() => selectOrder(x, { method: 'nls', maxP: 1, criterion: 'aic', budgetMs: 0 }))).toBe('invalid-argument');
    expect(code(() => selectOrder([1, 2, Number.POSITIVE_INFINITY, 4], { method: 'nls', maxP: 1, criterion: 'aic' }))).toBe(
      'non-finite-input',
    );
    // Every candidate fails on a constant series: the first candidate's error is thrown.
    expect(code(() => selectOrder(new Array(40).fill(2), { method: 'cmle', maxP: 2, criterion: 'bic' }))).toBe('constant-series');
  });
});
