/**
 * Order selection for AR(p) and ARMA(p, q) models over a grid, by AIC, AICc or BIC, within a time budget.
 *
 * Model: (x_t − μ) = Σ_{i=1..p} φ_i (x_{t−i} − μ) + e_t + Σ_{j=1..q} θ_j e_{t−j}, 0 ≤ p ≤ maxP,
 * 0 ≤ q ≤ maxQ (q = 0 for the AR-only methods), R's `arima` sign convention.
 *
 * Method: fit every candidate and rank by the chosen criterion (Akaike 1974, IEEE Trans. Autom.
 * Control 19(6); Hurvich & Tsai 1989, Biometrika 76(2); Schwarz 1978, Ann. Stat. 6(2); Brockwell &
 * Davis 2016, Introduction to Time Series and Forecasting, 3rd ed., §5.5). Candidates are fitted in
 * order of increasing p + q (then p), so a tight budget still covers the simple models; once `budgetMs`
 * has elapsed no new candidate is started and the rest are listed as skipped.
 *
 * Conventions:
 * - Criteria come from each estimator's conditional likelihood, −(m/2)(log(2πσ²) + 1) over its
 *   m residuals. A conditional likelihood built on fewer residuals for larger p is not comparable
 *   across p, so by default ('cmle' and 'nls', `commonSample: true`) every candidate is fitted to the
 *   series with its first maxP − p values dropped: each then conditions on the same first maxP
 *   observations and sums over the same n − maxP residuals (common practice: likelihoods compared
 *   across orders must cover the same observations). `best` is then refitted on the whole series, so it is
 *   exactly what the estimator gives for that order; its criteria are those of the refit.
 * - 'yule-walker' always uses the whole series: the method conditions on nothing, so the table's
 *   criteria use the Gaussian likelihood over all n observations with the plain Levinson-Durbin σ²_p,
 *   ℓ = −(n/2)(log(2πσ²_p) + 1), K = p + 2 (AIC = −2ℓ + 2K, AICc with n, BIC = −2ℓ + K·log n).
 *   This ranks exactly as R's `ar()`, whose AIC is n·log(σ²_p) + 2p + 2: ours is R's plus the constant
 *   n(log 2π + 1) + 2 (checked against fixtures/reference/ref/*.json, yule_walker_aic_selection).
 *   The estimator's own criteria (core ar/yule-walker.ts, and so `best.aic`) are conditional ones over
 *   n − p residuals, −((n − p)/2)(log(2πσ²_p) + 1); ranking by those shifts AIC by about
 *   −(log(2πσ²_p) + 1) per extra lag and so picks far larger orders whenever σ² > 1/(2πe):
 *   AR(19) (the top of the grid) instead of R's AR(2) on LakeHuron, AR(18) instead of AR(13) on
 *   USAccDeaths; on lh (σ² ≈ 0.19) both pick AR(3).
 * - Failed candidates carry `error` (the estimator's message) instead of throwing; an NLS fit that did
 *   not converge is kept in the table with its numbers and `error`, but never chosen.
 *
 * @throws ForecastingError('invalid-argument') for a bad grid, a method that cannot be order-selected
 * (ridge and lasso choose lags by their penalty) or q > 0 with an AR-only method;
 * ('non-finite-input') for a non-finite series; and, when no candidate could be fitted at all, the
 * error of the first candidate.
 *
 * References: Akaike (1974); Hurvich & Tsai (1989); Schwarz (1978); Brockwell & Davis (2016) §5.5;
 * R `stats::ar` (ar.R) for its AIC.
 */
import { cmleAr } from '../ar/cmle';
import { yuleWalker } from '../ar/yule-walker';
import { nlsArma, type NlsOptions } from '../arma/nls';
import { assertFinite, ForecastingError } from '../core/errors';
import type { FitMethod, FitResult } from '../core/types';

const FN = 'selectOrder';

/** The information criteria selectOrder can rank by. */
export type OrderCriterion = 'aic' | 'aicc' | 'bic';

/** Options of selectOrder. */
export interface SelectOrderOptions {
  method: FitMethod;
  maxP: number;
  /** Largest MA order (NLS only); default 0. */
  maxQ?: number;
  criterion: OrderCriterion;
  /** Stop starting new candidates after this many milliseconds; default no limit. */
  budgetMs?: number;
  /** Fit every candidate on the same residuals (see Conventions); default true. Ignored by Yule-Walker. */
  commonSample?: boolean;
  /** Passed to nlsArma. */
  nls?: NlsOptions;
  /** Milliseconds clock, default performance.now (replaceable to test the budget deterministically). */
  clock?: () => number;
}

/** One row of the selection table. */
export interface OrderCandidate {
  p: number;
  q: number;
  aic: number | null;
  aicc: number | null;
  bic: number | null;
  loglik: number | null;
  sigma2: number | null;
  /** Terms in the candidate's likelihood: its residuals (n − maxP with a common sample), or n for Yule-Walker. */
  nUsed: number | null;
  /** Why the candidate has no usable criteria (failed, not converged, or skipped). */
  error?: string;
  /** True when the time budget ran out before this candidate was started. */
  skipped?: boolean;
}

/** The chosen model and the whole ranked table. */
export interface OrderSelection {
  best: FitResult;
  /** Ranked by the criterion (best first); failed, then skipped candidates last. */
  table: OrderCandidate[];
  criterion: OrderCriterion;
  /** Candidates the budget left out, in the order they would have been fitted. */
  skipped: Array<{ p: number; q: number }>;
  elapsedMs: number;
}

/** Selects (p, q) over the grid by the criterion; see the file comment for conventions. */
export function selectOrder(x: ArrayLike<number>, options: SelectOrderOptions): OrderSelection {
  const { method, maxP, criterion } = options;
  const maxQ = options.maxQ ?? 0;
  const budgetMs = options.budgetMs ?? Infinity;
  const clock = options.clock ?? (() => performance.now());
  validate(method, maxP, maxQ, criterion, budgetMs);
  assertFinite(FN, x);
  const commonSample = (options.commonSample ?? true) && method !== 'yule-walker';
  const series = Float64Array.from(x);
  const fit = (data: Float64Array, p: number, q: number): FitResult => {
    if (method === 'yule-walker') return yuleWalker(data, p);
    if (method === 'cmle') return cmleAr(data, p);
    return nlsArma(data, p, q, options.nls);
  };

  const grid: Array<{ p: number; q: number }> = [];
  for (let p = 0; p <= maxP; p++) for (let q = 0; q <= maxQ; q++) grid.push({ p, q });
  grid.sort((a, b) => a.p + a.q - (b.p + b.q) || a.p - b.p);

  const started = clock();
  const rows: OrderCandidate[] = [];
  const fits = new Map<string, FitResult>();
  const skipped: Array<{ p: number; q: number }> = [];
  let firstError: unknown = null;
  for (const { p, q } of grid) {
    if (rows.length > 0 && clock() - started >= budgetMs) {
      skipped.push({ p, q });
      continue;
    }
    const data = commonSample ? series.subarray(maxP - p) : series;
    try {
      const result = fit(data, p, q);
      const row = method === 'yule-walker' ? fullSampleRow(result, p, data.length) : rowOf(result, p, q, data.length - p);
      if (result.converged === false) row.error = `did not converge in ${result.iterations} iterations`;
      else fits.set(`${p},${q}`, result);
      rows.push(row);
    } catch (error) {
      firstError ??= error;
      rows.push({ p, q, aic: null, aicc: null, bic: null, loglik: null, sigma2: null, nUsed: null, error: messageOf(error) });
    }
  }

  const usable = rows.filter((row) => row.error === undefined && row[criterion] !== null);
  usable.sort((a, b) => (a[criterion] as number) - (b[criterion] as number));
  const unusable = rows.filter((row) => !usable.includes(row));
  const budgetNote = `skipped: the time budget of ${budgetMs} ms was spent after ${rows.length} candidates`;
  const table: OrderCandidate[] = [
    ...usable,
    ...unusable.map((row) => (row.error === undefined ? { ...row, error: `no ${criterion} (too few residuals for it)` } : row)),
    ...skipped.map(({ p, q }) => ({
      p,
      q,
      aic: null,
      aicc: null,
      bic: null,
      loglik: null,
      sigma2: null,
      nUsed: null,
      error: budgetNote,
      skipped: true,
    })),
  ];
  if (usable.length === 0) {
    if (firstError instanceof ForecastingError) throw firstError;
    throw new ForecastingError(
      'no-convergence',
      FN,
      `no candidate could be fitted: ${table.map((row) => `(${row.p},${row.q}) ${row.error}`).join('; ')}`,
    );
  }

  const winner = usable[0];
  let best = fits.get(`${winner.p},${winner.q}`)!;
  if (commonSample && winner.p < maxP) {
    // Refit on the whole series so `best` is the estimator's own fit for that order.
    try {
      const full = fit(series, winner.p, winner.q);
      if (full.converged !== false) best = full;
    } catch {
      // Keep the common-sample fit: it is a valid fit of the same order.
    }
  }
  return { best, table, criterion, skipped, elapsedMs: clock() - started };
}

/** A table row from a fit. */
function rowOf(result: FitResult, p: number, q: number, nUsed: number): OrderCandidate {
  return { p, q, aic: result.aic, aicc: result.aicc, bic: result.bic, loglik: result.loglik, sigma2: result.sigma2, nUsed };
}

/** A Yule-Walker row with criteria from the Gaussian likelihood over all n observations (see Conventions). */
function fullSampleRow(result: FitResult, p: number, n: number): OrderCandidate {
  const loglik = -(n / 2) * (Math.log(2 * Math.PI * result.sigma2) + 1);
  const k = p + 2;
  const aic = -2 * loglik + 2 * k;
  const aicc = n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : null;
  return { p, q: 0, aic, aicc, bic: -2 * loglik + k * Math.log(n), loglik, sigma2: result.sigma2, nUsed: n };
}

/** The message of anything thrown. */
function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/** Throws 'invalid-argument' for a grid or method selectOrder cannot run. */
function validate(method: FitMethod, maxP: number, maxQ: number, criterion: string, budgetMs: number): void {
  const fail = (detail: string) => {
    throw new ForecastingError('invalid-argument', FN, detail);
  };
  if (method === 'ridge' || method === 'lasso')
    fail(`method '${method}' chooses its lags by its penalty; order selection runs for 'yule-walker', 'cmle' or 'nls'`);
  if (method !== 'yule-walker' && method !== 'cmle' && method !== 'nls') fail(`unknown method '${method}'`);
  if (!Number.isInteger(maxP) || maxP < 0) fail(`maxP must be a non-negative integer, got ${maxP}`);
  if (!Number.isInteger(maxQ) || maxQ < 0) fail(`maxQ must be a non-negative integer, got ${maxQ}`);
  if (maxQ > 0 && method !== 'nls') fail(`method '${method}' fits AR models only; use maxQ = 0 or method 'nls'`);
  if (criterion !== 'aic' && criterion !== 'aicc' && criterion !== 'bic')
    fail(`criterion must be 'aic', 'aicc' or 'bic', got '${criterion}'`);
  if (!(budgetMs > 0)) fail(`budgetMs must be positive, got ${budgetMs}`);
}
