import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { autocorrelation } from '../acf/autocovariance';
import { expectRelative, loadReference, loadSeries, referenceSeries } from '../core/spec-support';
import { yuleWalker } from './yule-walker';

describe('yuleWalker', () => {
  // Source: fixtures/reference/ref/<series>.json, yule_walker[p] from 'ar.yw(x, aic = FALSE, order.max = p)', R 4.2.2,
  // 15 significant digits. Levinson-Durbin is a handful of well-conditioned operations: 1e-8 relative (the engine's
  // agreed tolerance for Yule-Walker) with several digits to spare.
  for (const name of referenceSeries) {
    it(`matches R ar.yw on ${name} for every stored order`, () => {
      const x = loadSeries(name);
      const reference = loadReference(name).yule_walker;
      for (const key of Object.keys(reference)) {
        const p = Number(key);
        const r = reference[key];
        const fit = yuleWalker(x, p);
        const n = x.length;
        expectRelative(fit.ar, r.ar, 1e-8, `${name} AR(${p}) φ`);
        expectRelative([fit.mean], [r.x_mean], 1e-8, `${name} AR(${p}) μ`);
        // Our σ² is the plain Levinson-Durbin variance; R's var.pred rescales it by n/(n − p − 1).
        expectRelative([fit.sigma2], [r.var_innov_levinson_plain], 1e-8, `${name} AR(${p}) σ²`);
        expectRelative([(fit.sigma2 * n) / (n - p - 1)], [r.var_pred_R], 1e-8, `${name} AR(${p}) R var.pred`);
        // R's asy.var.coef = Γ⁻¹·var.pred/n; ours uses the plain σ², so ours² = R's diagonal·(n − p − 1)/n.
        const rStderr = r.asy_var_coef.map((row: number[], i: number) => Math.sqrt((row[i] * (n - p - 1)) / n));
        expectRelative(fit.stderr.ar!, rStderr, 1e-8, `${name} AR(${p}) stderr`);
      }
    });
  }

  it('AR(1) gives φ = r(1) and σ² = γ(0)(1 − r(1)²) (closed form, Brockwell & Davis 2016, §5.1.1)', () => {
    const x = loadSeries('LakeHuron');
    const fit = yuleWalker(x, 1);
    const r = autocorrelation(x, 1);
    expect(fit.ar[0]).toBe(r[1]);
    const gamma0 = loadReference('LakeHuron').acf.autocovariance[0];
    expect(fit.sigma2).toBeCloseTo(gamma0 * (1 - r[1] ** 2), 12);
  });

  it('reports residuals with p leading zeros and the conditional criteria with k = p + 2', () => {
    const x = loadSeries('lh');
    const fit = yuleWalker(x, 2);
    expect(fit.residuals.length).toBe(48);
    expect([fit.residuals[0], fit.residuals[1]]).toEqual([0, 0]);
    const w = x.map((v) => v - fit.mean);
    expect(fit.residuals[2]).toBeCloseTo(w[2] - fit.ar[0] * w[1] - fit.ar[1] * w[0], 14);
    const loglik = -(46 / 2) * (Math.log(2 * Math.PI * fit.sigma2) + 1);
    expect(fit.loglik).toBeCloseTo(loglik, 12);
    expect(fit.aic).toBeCloseTo(-2 * loglik + 8, 12);
    expect(fit.bic).toBeCloseTo(-2 * loglik + 4 * Math.log(46), 12);
    expect(fit.aicc).toBeCloseTo(-2 * loglik + 8 + 40 / 41, 12);
  });

  it('refuses constant, short and non-finite series', () => {
    expect(() => yuleWalker([2, 2, 2, 2, 2], 1)).toThrow(expect.objectContaining({ code: 'constant-series' }));
    expect(() => yuleWalker([1, 2, 3], 3)).toThrow(expect.objectContaining({ code: 'too-few-observations' }));
    expect(() => yuleWalker([1, 2, Number.NaN, 4], 1)).toThrow(expect.objectContaining({ code: 'non-finite-input' }));
  });
});

describe('yuleWalker against statsmodels yule_walker(method="mle") (second reference)', () => {
  // Source: fixtures/reference/ref/<series>.statsmodels.json, yule_walker[p].call_mle = "yule_walker(x, order=p,
  // method='mle', demean=True)", statsmodels 0.13.5: divisor n and the plain Levinson-Durbin σ², as here. Its
  // default method='adjusted' (divisor n − k) differs at the second digit and is not ours.
  for (const name of ['lh', 'LakeHuron'] as const) {
    it(`matches statsmodels' φ and σ² on ${name} (p = 1, 2, 3)`, () => {
      const reference = JSON.parse(
        readFileSync(new URL(`../../../../fixtures/reference/ref/${name}.statsmodels.json`, import.meta.url), 'utf8'),
      );
      const x = loadSeries(name);
      for (const p of [1, 2, 3]) {
        const fit = yuleWalker(x, p);
        expectRelative(fit.ar, reference.yule_walker[p].rho_mle, 1e-8, `${name} AR(${p}) φ`);
        expectRelative([fit.sigma2], [reference.yule_walker[p].sigma2_mle], 1e-8, `${name} AR(${p}) σ²`);
      }
    });
  }
});
