import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { expectRelative, loadReference, loadSeries, referenceSeries } from '../core/spec-support';
import { cmleAr } from './cmle';

describe('cmleAr', () => {
  // Source: fixtures/reference/ref/<series>.json, ols[p].lm_ols from 'E <- embed(as.numeric(x), p + 1);
  // lm(E[, 1] ~ E[, -1])' and ols[p].ar_ols_intercept from 'ar.ols(x, aic = FALSE, order.max = p, demean = TRUE,
  // intercept = TRUE)', R 4.2.2, 15 significant digits. QR least squares on these small, well-conditioned designs
  // reproduces R's (also QR) solution far inside the agreed 1e-8 relative.
  for (const name of referenceSeries) {
    it(`matches R lm / ar.ols on ${name} (p = 1, 2, 3)`, () => {
      const x = loadSeries(name);
      const reference = loadReference(name).ols;
      for (const key of Object.keys(reference)) {
        const p = Number(key);
        const lm = reference[key].lm_ols;
        const fit = cmleAr(x, p);
        expectRelative(fit.ar, lm.ar, 1e-8, `${name} AR(${p}) φ`);
        expectRelative(fit.ar, reference[key].ar_ols_intercept.ar, 1e-8, `${name} AR(${p}) φ vs ar.ols`);
        expectRelative([fit.intercept], [lm.intercept], 1e-8, `${name} AR(${p}) c`);
        expectRelative([fit.mean], [lm.implied_mean], 1e-8, `${name} AR(${p}) μ`);
        expectRelative([fit.sigma2], [lm.sigma2_divisor_n_minus_p], 1e-8, `${name} AR(${p}) σ²`);
        expectRelative([fit.sigma2], [reference[key].ar_ols_intercept.var_pred], 1e-8, `${name} AR(${p}) ar.ols var.pred`);
        // coef_se_unbiased = summary(lm) standard errors of (intercept, φ_1..φ_p), s² = RSS/(n − 2p − 1).
        expectRelative([fit.interceptStderr, ...fit.stderr.ar!], lm.coef_se_unbiased, 1e-8, `${name} AR(${p}) stderr`);
        expectRelative([fit.loglik!], [lm.cond_loglik_at_mle], 1e-8, `${name} AR(${p}) loglik`);
        const rss = fit.residuals.reduce((s, e) => s + e * e, 0);
        expectRelative([rss], [lm.rss], 1e-8, `${name} AR(${p}) RSS`);
      }
    });
  }

  it('gives the delta-method standard error of μ that R computes from vcov(lm) (lh, p = 1, 2, 3)', () => {
    // Rscript: for (p in 1:3) { E <- embed(as.numeric(lh), p+1); f <- lm(E[,1] ~ E[,-1]); b <- coef(f); V <- vcov(f);
    //   s <- 1 - sum(b[-1]); g <- c(1/s, rep(b[1]/s^2, p)); sqrt(t(g) %*% V %*% g) }  (R 4.2.2, printed with %.15g)
    const expected = [0.161865022062778, 0.132438789315701, 0.106319206162406];
    const x = loadSeries('lh');
    expectRelative(
      [1, 2, 3].map((p) => cmleAr(x, p).stderr.mean!),
      expected,
      1e-8,
      'stderr μ',
    );
  });

  it('agrees with R arima(method = "CSS") for a pure AR, as conditional least squares must (lh ols[2].arima_css)', () => {
    // R's optimiser stops within ~1e-5 of the exact least-squares answer (README convention 5), hence 1e-4.
    const css = loadReference('lh').ols['2'].arima_css;
    const fit = cmleAr(loadSeries('lh'), 2);
    expectRelative(fit.ar, [css.coef.ar1, css.coef.ar2], 1e-4, 'φ vs CSS');
    expectRelative([fit.mean], [css.coef.intercept], 1e-4, 'μ vs CSS');
  });

  it('refuses explosive, constant and collinear series', () => {
    const explosive = Array.from({ length: 40 }, (_, t) => 1.2 ** t + Math.sin(t));
    expect(() => cmleAr(explosive, 1)).toThrow(expect.objectContaining({ code: 'non-stationary' }));
    expect(() => cmleAr([4, 4, 4, 4, 4, 4], 1)).toThrow(expect.objectContaining({ code: 'constant-series' }));
    const trend = Array.from({ length: 20 }, (_, t) => t);
    expect(() => cmleAr(trend, 2)).toThrow(expect.objectContaining({ code: 'singular-matrix' }));
    expect(() => cmleAr([1, 2, 3, 4, 5], 2)).toThrow(expect.objectContaining({ code: 'too-few-observations' }));
  });
});

describe('cmleAr against statsmodels AutoReg (second reference)', () => {
  // Source: fixtures/reference/ref/<series>.statsmodels.json, autoreg[p] = "AutoReg(x, lags=p, trend='c',
  // old_names=False).fit()", statsmodels 0.13.5. AutoReg is the conditional MLE with σ² = RSS/(n − p) and counts
  // k = p + 2 parameters in its AIC, as we do; its bse use σ² = RSS/(n − p), so they are not compared here.
  for (const name of ['lh', 'LakeHuron'] as const) {
    it(`reproduces AutoReg's coefficients, σ², log-likelihood and AIC on ${name} (p = 1, 2, 3)`, () => {
      const reference = JSON.parse(
        readFileSync(new URL(`../../../../fixtures/reference/ref/${name}.statsmodels.json`, import.meta.url), 'utf8'),
      );
      const x = loadSeries(name);
      for (const p of [1, 2, 3]) {
        const autoreg = reference.autoreg[p];
        const fit = cmleAr(x, p);
        expectRelative([fit.intercept, ...fit.ar], autoreg.params, 1e-8, `${name} AR(${p}) params`);
        expectRelative(
          [fit.sigma2, fit.loglik!, fit.aic!],
          [autoreg.sigma2, autoreg.llf, autoreg.aic],
          1e-8,
          `${name} AR(${p}) σ², ℓ, AIC`,
        );
      }
    });
  }
});
