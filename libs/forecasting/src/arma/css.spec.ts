// Checks of the conditional sum of squares and its recursive derivatives.
// Sources: fixtures/reference/ref/lh.json arma["1,1"].css.css_manual_check (R 4.2.2, residuals of
// `arima(x, order = c(1, 0, 1), method = "CSS", include.mean = TRUE)` recomputed by hand in R);
// the derivative recursions (Box, Jenkins, Reinsel & Ljung 2016 §7.2.2) against central finite
// differences of the same function (common practice).
import { describe, expect, it } from 'vitest';
import { armaResiduals } from '../core/arma-filter';
import { loadReference, loadSeries } from '../core/spec-support';
import { compiledPass } from './css-compiled';
import { createCssWorkspace, cssNormalEquations, cssSumOfSquares, genericNormalEquations, type CssLayout } from './css';

const lh = Float64Array.from(loadSeries('lh'));

/** Sum of squares at beta, fresh buffers. */
function css(x: Float64Array, beta: number[], layout: CssLayout): number {
  return cssSumOfSquares(x, Float64Array.from(beta), layout, new Float64Array(x.length));
}

describe('cssSumOfSquares', () => {
  it('reproduces R’s CSS at R’s ARMA(1,1) estimate of lh (css_manual_check, 1e-12 relative)', () => {
    const ref = loadReference('lh').arma['1,1'].css;
    const { ar1, ma1, intercept } = ref.default.coef;
    // R stores 15 significant digits; the sum of squares is then exact to ~1e-14 relative.
    const value = css(lh, [ar1, ma1, intercept], { p: 1, q: 1, includeMean: true });
    expect(Math.abs(value - ref.css_manual_check.ssq) / ref.css_manual_check.ssq).toBeLessThan(1e-12);
    expect(value / ref.css_manual_check.n_minus_ncond).toBeCloseTo(ref.default.sigma2, 14);
  });

  it('returns the same residuals as the shared CSS filter armaResiduals, leading p zeros included', () => {
    const residuals = new Float64Array(lh.length);
    cssSumOfSquares(lh, Float64Array.from([0.9, -0.3, 0.4, -0.2, 2.3]), { p: 2, q: 2, includeMean: true }, residuals);
    const shared = armaResiduals(lh, 2.3, [0.9, -0.3], [0.4, -0.2]);
    expect(residuals[0]).toBe(0);
    expect(residuals[1]).toBe(0);
    for (let t = 0; t < lh.length; t++) expect(residuals[t]).toBeCloseTo(shared[t], 13);
  });

  it('fixes μ at 0 when the mean is not estimated', () => {
    const withZeroMean = css(lh, [0.5, 0.2, 0], { p: 1, q: 1, includeMean: true });
    expect(css(lh, [0.5, 0.2], { p: 1, q: 1, includeMean: false })).toBe(withZeroMean);
  });

  it('reports an explosive recursion as Infinity rather than NaN', () => {
    const long = new Float64Array(5000).fill(1);
    long[0] = 2;
    expect(css(long, [0, 50], { p: 1, q: 1, includeMean: false })).toBe(Infinity);
  });
});

describe('cssNormalEquations', () => {
  const cases: Array<{ layout: CssLayout; beta: number[] }> = [
    { layout: { p: 1, q: 1, includeMean: true }, beta: [0.45, 0.25, 2.4] },
    { layout: { p: 2, q: 1, includeMean: true }, beta: [1.1, -0.45, -0.4, 2.39] },
    { layout: { p: 1, q: 2, includeMean: true }, beta: [0.1, 0.6, 0.35, 2.41] },
    { layout: { p: 0, q: 3, includeMean: false }, beta: [0.5, 0.3, -0.2] },
    { layout: { p: 3, q: 0, includeMean: true }, beta: [0.6, -0.1, -0.2, 2.4] },
  ];
  for (const { layout, beta } of cases) {
    it(`gives JᵀJ, Jᵀe and ½∇²CSS that match finite differences for ARMA(${layout.p},${layout.q})${layout.includeMean ? ' with mean' : ''}`, () => {
      const k = beta.length;
      const workspace = createCssWorkspace(lh.length, layout);
      const jtj = new Float64Array(k * k);
      const jte = new Float64Array(k);
      const hessian = new Float64Array(k * k);
      const value = cssNormalEquations(lh, Float64Array.from(beta), workspace, jtj, jte, hessian);
      expect(value).toBeCloseTo(css(lh, beta, layout), 12);
      // ∇CSS = 2Jᵀe and ∇²CSS = 2·hessian; central differences with h = 1e-5 are good to ~1e-8 here.
      const h = 1e-5;
      const shifted = (i: number, di: number, j = -1, dj = 0) => {
        const b = beta.slice();
        b[i] += di;
        if (j >= 0) b[j] += dj;
        return css(lh, b, layout);
      };
      for (let i = 0; i < k; i++) {
        const gradient = (shifted(i, h) - shifted(i, -h)) / (2 * h);
        expect(Math.abs(2 * jte[i] - gradient)).toBeLessThan(1e-6 * (1 + Math.abs(gradient)));
        for (let j = 0; j < k; j++) {
          const second = (shifted(i, h, j, h) - shifted(i, h, j, -h) - shifted(i, -h, j, h) + shifted(i, -h, j, -h)) / (4 * h * h);
          expect(Math.abs(2 * hessian[i * k + j] - second)).toBeLessThan(1e-4 * (1 + Math.abs(second)));
        }
      }
      // JᵀJ is symmetric positive semi-definite: check the diagonal and symmetry.
      for (let i = 0; i < k; i++) {
        expect(jtj[i * k + i]).toBeGreaterThan(0);
        for (let j = 0; j < k; j++) expect(jtj[i * k + j]).toBe(jtj[j * k + i]);
      }
    });
  }
});

describe('compiled and generic passes', () => {
  const layouts: CssLayout[] = [
    { p: 2, q: 1, includeMean: true },
    { p: 0, q: 2, includeMean: true },
    { p: 3, q: 3, includeMean: false },
    { p: 1, q: 0, includeMean: true },
    { p: 5, q: 4, includeMean: true },
  ];
  for (const layout of layouts) {
    it(`agree for ARMA(${layout.p},${layout.q})${layout.includeMean ? ' with mean' : ''} (1e-12 relative)`, () => {
      const k = layout.p + layout.q + (layout.includeMean ? 1 : 0);
      const beta = Float64Array.from({ length: k }, (_, i) => (i === layout.p + layout.q ? 2.4 : (0.3 / (i + 2)) * (i % 2 === 0 ? 1 : -1)));
      const workspace = createCssWorkspace(lh.length, layout);
      const withHessian = compiledPass(layout, true) !== null;
      const run = (pass: typeof genericNormalEquations) => {
        const jtj = new Float64Array(k * k);
        const jte = new Float64Array(k);
        const hessian = withHessian ? new Float64Array(k * k) : null;
        const value = pass(lh, beta, workspace, jtj, jte, hessian);
        return [value, ...jtj, ...jte, ...(hessian ?? [])];
      };
      expect(compiledPass(layout, false)).not.toBeNull();
      const fast = run(cssNormalEquations);
      const generic = run(genericNormalEquations);
      fast.forEach((value, i) => expect(Math.abs(value - generic[i])).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(generic[i]))));
    });
  }

  it('falls back to the generic loop for models too large to unroll', () => {
    expect(compiledPass({ p: 12, q: 1, includeMean: true }, false)).toBeNull();
    expect(compiledPass({ p: 4, q: 2, includeMean: true }, true)).toBeNull();
  });
});
