/**
 * Standardised lagged design for regularised AR: the regression of x_t on x_{t−L_1}, …, x_{t−L_k}.
 *
 * Model (sign convention of R's arima, for definiteness):
 *   (x_t − μ) = Σ_j φ_{L_j} (x_{t−L_j} − μ) + e_t,  equivalently  x_t = c + Σ_j φ_{L_j} x_{t−L_j} + e_t,  c = μ(1 − Σφ).
 *
 * Method: the rows are t = maxLag+1..n (conditioning on the first maxLag values, as conditional least squares);
 * each regressor column is centred and divided by its standard deviation, the response is centred, so the
 * intercept drops out of the penalised problem and is recovered afterwards (Hastie, Tibshirani & Friedman 2009,
 * The Elements of Statistical Learning, 2nd ed., §3.4.1; Friedman, Hastie & Tibshirani 2010, J. Stat. Softw. 33(1), §2).
 *
 * Conventions: column standard deviations use divisor m = n − maxLag (as glmnet), so every standardised column
 * has Σ z² = m exactly; the penalty then treats every lag on the same scale whatever the units of the load.
 *
 * @throws ForecastingError 'invalid-argument' for an empty, non-integer, non-positive or repeated lag;
 *   'non-finite-input'; 'too-few-observations' unless n − maxLag ≥ k + 2; 'constant-series' when a lagged column
 *   or the response has no variation.
 * References: Friedman, Hastie & Tibshirani (2010), J. Stat. Softw. 33(1); Hastie, Tibshirani & Friedman (2009).
 */
import { ForecastingError, assertFinite, assertLength } from '../core/errors';

/** The centred and scaled lagged regression behind ridge and lasso AR. */
export interface LaggedDesign {
  /** Lags in increasing order. */
  lags: number[];
  /** Largest lag: the number of leading observations conditioned on. */
  maxLag: number;
  /** Rows used: n − maxLag. */
  rows: number;
  /** Standardised columns, one Float64Array of length `rows` per lag. */
  columns: Float64Array[];
  /** Centred response x_t − ȳ for t = maxLag+1..n. */
  response: Float64Array;
  /** Mean ȳ of the response rows. */
  responseMean: number;
  /** Mean of each raw lagged column. */
  columnMeans: Float64Array;
  /** Standard deviation (divisor `rows`) of each raw lagged column. */
  columnScales: Float64Array;
}

/** Checks a lag set and returns it sorted; throws on an empty, non-integer, non-positive or repeated lag. */
export function normaliseLags(fn: string, lags: readonly number[]): number[] {
  if (lags.length === 0) throw new ForecastingError('invalid-argument', fn, 'the lag set is empty: pass e.g. lags 1..48 and 168');
  const sorted = [...lags].sort((a, b) => a - b);
  for (let i = 0; i < sorted.length; i++) {
    const lag = sorted[i];
    if (!Number.isInteger(lag) || lag < 1) {
      throw new ForecastingError('invalid-argument', fn, `lags must be positive integers, got ${lag}`);
    }
    if (i > 0 && sorted[i - 1] === lag) throw new ForecastingError('invalid-argument', fn, `lag ${lag} appears twice`);
  }
  return sorted;
}

/** Builds the standardised lagged design of `x` for the given lags (see the file comment). */
export function buildLaggedDesign(fn: string, x: ArrayLike<number>, lagSet: readonly number[]): LaggedDesign {
  const lags = normaliseLags(fn, lagSet);
  assertFinite(fn, x);
  const maxLag = lags[lags.length - 1];
  const k = lags.length;
  assertLength(fn, x, maxLag + k + 2, `largest lag ${maxLag} plus ${k} lags plus 2`);
  const rows = x.length - maxLag;

  let responseMean = 0;
  for (let t = maxLag; t < x.length; t++) responseMean += x[t];
  responseMean /= rows;
  const response = new Float64Array(rows);
  let responseSs = 0;
  for (let r = 0; r < rows; r++) {
    response[r] = x[maxLag + r] - responseMean;
    responseSs += response[r] * response[r];
  }
  if (!(responseSs > 0)) throw new ForecastingError('constant-series', fn, 'the series is constant after the first maxLag values');

  // Each column is a window of x: its mean and sum of squares come from prefix sums of x centred on its own
  // mean (so no window's sum of squares cancels badly), one pass in all instead of two per lag. A window whose
  // spread is lost in rounding is measured again directly, which also tells a constant column exactly.
  const columnMeans = new Float64Array(k);
  const columnScales = new Float64Array(k);
  const n = x.length;
  let centre = 0;
  for (let t = 0; t < n; t++) centre += x[t];
  centre /= n;
  const sums = new Float64Array(n + 1);
  const squares = new Float64Array(n + 1);
  for (let t = 0; t < n; t++) {
    const z = x[t] - centre;
    sums[t + 1] = sums[t] + z;
    squares[t + 1] = squares[t] + z * z;
  }
  for (let j = 0; j < k; j++) {
    const lag = lags[j];
    const from = maxLag - lag;
    const windowMean = (sums[from + rows] - sums[from]) / rows;
    const windowSquares = squares[from + rows] - squares[from];
    let mean = centre + windowMean;
    let ss = windowSquares - rows * windowMean * windowMean;
    if (!(ss > 1e-9 * windowSquares)) ({ mean, ss } = windowSpread(x, from, rows));
    const scale = Math.sqrt(ss / rows);
    if (!(scale > 0)) throw new ForecastingError('constant-series', fn, `the column at lag ${lag} is constant`);
    columnMeans[j] = mean;
    columnScales[j] = scale;
  }
  // The standardised columns are made on first use: the lasso with its Gram matrix from lag shifts
  // (lagged-gram.ts) never reads them, and for lags 1–48 and 168 of a year of hours they are 3 MB.
  let columns: Float64Array[] | null = null;
  const source = Float64Array.from(x); // the columns must not follow later changes to the caller's array
  const design = { lags, maxLag, rows, response, responseMean, columnMeans, columnScales } as LaggedDesign;
  Object.defineProperty(design, 'columns', {
    enumerable: true,
    get: () =>
      (columns ??= lags.map((lag, j) => {
        const column = new Float64Array(rows);
        for (let r = 0; r < rows; r++) column[r] = (source[maxLag + r - lag] - columnMeans[j]) / columnScales[j];
        return column;
      })),
  });
  return design;
}

/** Mean and sum of squared deviations of x[from … from + rows) by two passes. */
function windowSpread(x: ArrayLike<number>, from: number, rows: number): { mean: number; ss: number } {
  let mean = 0;
  for (let r = 0; r < rows; r++) mean += x[from + r];
  mean /= rows;
  let ss = 0;
  for (let r = 0; r < rows; r++) {
    const d = x[from + r] - mean;
    ss += d * d;
  }
  return { mean, ss };
}
