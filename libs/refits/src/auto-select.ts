/**
 * `auto`: fits a fixed, cheap candidate set and picks one by a rolling-origin backtest against seasonal
 * naive. The set is the same on an idle and a busy machine: there is no time budget, every candidate
 * always runs (their cost is bounded by the data length, not by a clock), so the same data and settings
 * always give the same choice.
 *
 * Candidates, each estimated on all but the last `origins` × 24 hours:
 * - on the settings' own design (by default the hour-of-week profile with calendar regressors, AR(2)
 *   errors for the GLS step): AR by least squares (conditional MLE) with the order by AIC (Yule-Walker
 *   likelihood, as R's `ar()`) up to 6;
 *   ridge AR over the daily and weekly lags 1–3, 24, 25, 168; lasso AR over lags 1–48 and 168 (the
 *   regularised wide-lag AR);
 * - on the weekly (168 h) and the daily (24 h) difference of the series and its regressors: AR by
 *   Yule-Walker and AR by least squares, the order by AIC (Yule-Walker likelihood, as R's `ar()`) up to
 *   the settings' largest AR order.
 * Each forecasts `horizon` hours from each daily origin of the held-out part, parameters fixed and the
 * actuals up to the origin known (origin-forecast.ts), and is scored there by MAE, the coverage of its 80 % and 95 % Gaussian
 * bands, and Ljung-Box on its estimation residuals (48 lags).
 *
 * Rule: candidates whose MAE is within 2 % of the best are near-equal. Among them, a candidate whose
 * residuals fail Ljung-Box badly (p < 0.001 and Q above four times its degrees of freedom) loses to one
 * that does not; then the smaller coverage gap |c80 − 80| + |c95 − 95| wins, then the lower MAE. Seasonal
 * naive wins only when no model beats its MAE. The winner is carried over the held-out hours with its
 * parameters fixed, so the forecast starts at the last actual.
 */
import type { FitCandidate, FitSelection, FittedMethod } from '@loadwright/contracts';
import {
  autocovariance,
  cmleAr,
  fitArmaPart,
  backTransformLog,
  fitLoadModel,
  levinsonDurbin,
  ljungBox,
  normalQuantile,
  yuleWalker,
  type FitResult,
  type FittedLoadModel,
  type LoadModelSpec,
  type LoadSeriesData,
  type RegularisedFit,
} from '@loadwright/forecasting';
import { regularisedLags, seasonalNaiveSpec, type ModelDesign } from './model-plan';
import { originForecaster, type OriginForecast } from './origin-forecast';
import { extendModel, modelAtOrigin, sliceData, type ExtendedModel } from './reanchor';
import { describeRefitError } from './refit-errors';

/** Settings of the candidate comparison. */
export interface AutoOptions {
  /** Daily forecast origins of the backtest (default 14: two weeks, so every weekday is scored twice). */
  origins?: number;
  /** Hours forecast from each origin (default 24). */
  horizon?: number;
  /** Largest AR order of the least-squares candidate on the settings' design (default 6, capped by the settings). */
  maxArOrder?: number;
  /** Largest AR order of the differenced candidates (default 48, the settings' largest AR order). */
  maxDifferencedArOrder?: number;
  /** Calendar regressors of the differenced candidates (default: the settings asked for day types, i.e. the design has them or a holiday calendar). */
  dayTypes?: boolean;
  /** Run only the candidates with these keys (e.g. ['weekly-yw']): to score one candidate alone as `auto` fits it. */
  only?: readonly CandidateKey[];
  /** Milliseconds clock for the fit times in the table only (default this process's CPU time); it never changes the choice. */
  clock?: () => number;
}

/** What `auto` chose and the model to forecast with. */
export interface AutoChoice {
  /** The chosen model, carried to the last actual. */
  model: FittedLoadModel;
  method: FittedMethod;
  selection: FitSelection;
  /** The chosen model over all of the data with its parameters fixed (null for seasonal naive), for calibrating its bands. */
  extended: ExtendedModel | null;
}

/** Short names of the candidates, `<design>-<estimator>`. */
export const candidateKeys = ['profile-ls', 'profile-ridge', 'profile-lasso', 'weekly-yw', 'weekly-ls', 'daily-yw', 'daily-ls'] as const;
/** One of candidateKeys. */
export type CandidateKey = (typeof candidateKeys)[number];

/** MAE ratio within which candidates count as near-equal. */
const NEAR = 1.02;
/** Shortest estimation part that still leaves room for the backtest: five weeks. */
const MIN_ESTIMATION_HOURS = 840;
/** Lags of the residual check (at least 24 more than the fitted coefficients). */
const LJUNG_BOX_LAGS = 48;
/** A Ljung-Box failure is bad when p < 0.001 and Q exceeds this multiple of its degrees of freedom. */
const BAD_Q_RATIO = 4;

/** One candidate: its design, its fitted ARMA part and the scores. */
interface Candidate {
  label: string;
  method: FittedMethod;
  designModel: FittedLoadModel | null;
  fit: FitResult | null;
  fitMs: number;
  error: string | null;
  extended: ExtendedModel | null;
  mae: number | null;
  rmse: number | null;
  mape: number | null;
  coverage80: number | null;
  coverage95: number | null;
  ljung: { statistic: number; df: number; pValue: number } | null;
  note: string | null;
}

/** Runs the comparison on `data` (see the file comment). */
export function autoSelect(design: ModelDesign, data: LoadSeriesData, options: AutoOptions = {}): AutoChoice {
  const clock = options.clock ?? cpuMilliseconds;
  const originCount = options.origins ?? 14;
  const horizon = options.horizon ?? 24;
  const n = data.values.length;
  const holdout = n - originCount * horizon >= MIN_ESTIMATION_HOURS ? originCount * horizon : 0;
  const m = n - holdout;
  const estimation = holdout === 0 ? data : sliceData(data, m);
  const maxP = Math.max(1, Math.min(6, options.maxArOrder ?? 6));
  const maxDiffP = Math.max(1, Math.min(options.maxDifferencedArOrder ?? 48, Math.floor(m / 20)));

  const candidates: Candidate[] = [];
  const blank = (label: string, method: FittedMethod): Candidate => ({
    label,
    method,
    designModel: null,
    fit: null,
    fitMs: 0,
    error: null,
    extended: null,
    mae: null,
    rmse: null,
    mape: null,
    coverage80: null,
    coverage95: null,
    ljung: null,
    note: null,
  });
  /** Fits the design once (AR(2) errors for the GLS step), then each ARMA part on its remainder. */
  const addDesign = (
    designSpec: ModelDesign,
    name: string,
    all: Array<{ key: CandidateKey; label: (fit: FitResult) => string; method: FittedMethod; run: (remainder: Float64Array) => FitResult }>,
  ): void => {
    const parts = options.only ? all.filter((part) => options.only!.includes(part.key)) : all;
    if (parts.length === 0) return;
    const at = clock();
    let designModel: FittedLoadModel;
    try {
      designModel = fitDesign(designSpec, estimation);
    } catch (error) {
      for (const part of parts) candidates.push({ ...blank(`${name} + ${part.method}`, part.method), error: describeRefitError(error) });
      return;
    }
    const designMs = clock() - at;
    for (const part of parts) {
      const started = clock();
      try {
        const fit = part.run(designModel.remainder);
        candidates.push({
          ...blank(`${name} + ${part.label(fit)}`, part.method),
          designModel,
          fit,
          fitMs: clock() - started + designMs / parts.length,
        });
      } catch (error) {
        candidates.push({ ...blank(`${name} + ${part.method}`, part.method), fitMs: clock() - started, error: describeRefitError(error) });
      }
    }
  };

  const baseName = describeDesign(design);
  addDesign(design, baseName, [
    {
      key: 'profile-ls',
      label: (fit) => `AR(${fit.p}) by least squares`,
      method: 'cmle',
      run: (u) => cmleAr(u, yuleWalkerOrderByAic(u, maxP)),
    },
    {
      key: 'profile-ridge',
      label: () => 'ridge AR (lags 1–3, 24, 25, 168)',
      method: 'ridge',
      run: (u) => fitArmaPart({ method: 'ridge', p: 168, q: 0, lags: [1, 2, 3, 24, 25, 168], select: 'bic' }, u),
    },
    {
      key: 'profile-lasso',
      label: () => 'lasso AR (lags 1–48, 168)',
      method: 'lasso',
      run: (u) => fitArmaPart({ method: 'lasso', p: 168, q: 0, lags: regularisedLags(48, [168]), select: 'bic' }, u),
    },
  ]);
  for (const lag of [168, 24] as const) {
    if (design.seasonal.kind === 'difference' && design.seasonal.lag === lag) continue;
    const differenced: ModelDesign = {
      ...design,
      seasonal: { kind: 'difference', lag },
      dayTypes: options.dayTypes ?? (design.dayTypes || design.holidays !== null),
    };
    const prefix = lag === 168 ? 'weekly' : 'daily';
    let order: number | null = null;
    const orderOf = (u: Float64Array) => (order ??= yuleWalkerOrderByAic(u, maxDiffP));
    addDesign(differenced, `${prefix} difference`, [
      { key: `${prefix}-yw`, label: (fit) => `AR(${fit.p}) by Yule-Walker`, method: 'yule-walker', run: (u) => yuleWalker(u, orderOf(u)) },
      { key: `${prefix}-ls`, label: (fit) => `AR(${fit.p}) by least squares`, method: 'cmle', run: (u) => cmleAr(u, orderOf(u)) },
    ]);
  }

  const naivePeriod = design.seasonal.kind === 'difference' ? design.seasonal.lag : 168;
  const origins = holdout === 0 ? [] : Array.from({ length: originCount }, (_, i) => m + i * horizon);
  const actual = (o: number, h: number) => data.values[o + h];
  const naiveErrors = origins.flatMap((o) =>
    Array.from({ length: horizon }, (_, h) => actual(o, h) - data.values[o + h - naivePeriod * Math.ceil((h + 1) / naivePeriod)]),
  );
  const naiveMae = meanAbs(naiveErrors);

  for (const candidate of candidates) {
    if (!candidate.fit || !candidate.designModel) continue;
    try {
      const fitdf = candidate.fit.ar.filter((phi) => phi !== 0).length + candidate.fit.q;
      const lags = Math.max(LJUNG_BOX_LAGS, fitdf + 24);
      if (candidate.fit.residuals.length > 5 * lags) {
        const test = ljungBox(candidate.fit.residuals, lags, fitdf);
        candidate.ljung = { statistic: test.statistic, df: test.df, pValue: test.pValue };
      }
      candidate.extended = extendModel(withArma(candidate.designModel, candidate.fit), data);
      if (origins.length === 0) continue;
      const errors: number[] = [];
      const pct: number[] = [];
      let in80 = 0;
      let in95 = 0;
      const forecastFrom = originForecaster(candidate.extended, horizon);
      for (const o of origins) {
        const forecast = loadScale(forecastFrom(o, horizon), design.log);
        const [band80, band95] = forecast.intervals;
        for (let h = 0; h < horizon; h++) {
          const y = actual(o, h);
          errors.push(y - forecast.mean[h]);
          pct.push(Math.abs((y - forecast.mean[h]) / y));
          if (y >= band80.lower[h] && y <= band80.upper[h]) in80++;
          if (y >= band95.lower[h] && y <= band95.upper[h]) in95++;
        }
      }
      candidate.mae = meanAbs(errors);
      candidate.rmse = rootMeanSquare(errors);
      candidate.mape = (100 * pct.reduce((s, v) => s + v, 0)) / pct.length;
      candidate.coverage80 = (100 * in80) / errors.length;
      candidate.coverage95 = (100 * in95) / errors.length;
    } catch (error) {
      candidate.error = describeRefitError(error);
      candidate.extended = null;
      candidate.mae = null;
    }
  }

  const usable = candidates.filter((c) => c.extended !== null);
  let winner: Candidate | null = null;
  let reason: string;
  if (origins.length === 0) {
    winner = [...usable].sort((a, b) => (a.fit!.aic ?? Infinity) - (b.fit!.aic ?? Infinity))[0] ?? null;
    reason = `The window is too short for a backtest (${n} hours); ${winner?.label ?? 'seasonal naive'} has the lowest AIC.`;
    for (const c of usable) if (c !== winner) c.note = 'higher AIC (no backtest: the window is too short)';
  } else {
    const scored = usable.filter((c) => c.mae !== null);
    const best = Math.min(...scored.map((c) => c.mae!));
    const near = scored.filter((c) => c.mae! <= best * NEAR);
    const passing = near.filter((c) => !failsBadly(c));
    const pool = passing.length > 0 ? passing : near;
    winner = [...pool].sort((a, b) => coverageGap(a) - coverageGap(b) || a.mae! - b.mae!)[0] ?? null;
    for (const c of scored) {
      if (c === winner) continue;
      if (c.mae! > best * NEAR) c.note = `MAE ${round(c.mae!)} is more than 2 % above the best (${round(best)})`;
      else if (failsBadly(c) && passing.length > 0)
        c.note = `near-equal MAE, but its residuals fail Ljung-Box badly (Q = ${round(c.ljung!.statistic)} on ${c.ljung!.df} df)`;
      else
        c.note = `near-equal MAE, but its bands cover further from nominal (80 %: ${round(c.coverage80!)} %, 95 %: ${round(c.coverage95!)} %)`;
    }
    if (!winner || winner.mae! >= naiveMae) {
      reason = winner
        ? `No model beat seasonal naive on the ${originCount} × ${horizon} h backtest (best ${winner.label}: MAE ${round(winner.mae!)} against ${round(naiveMae)}).`
        : 'Every model candidate failed; seasonal naive is used.';
      if (winner) winner.note = `MAE ${round(winner.mae!)} does not beat seasonal naive (${round(naiveMae)})`;
      winner = null;
    } else {
      const skill = Math.round((1 - winner.mae! / naiveMae) * 100);
      reason =
        near.length > 1
          ? `${winner.label}: among the ${near.length} candidates within 2 % of the best MAE on the ${originCount} × ${horizon} h backtest, ` +
            `its residuals pass the Ljung-Box screen and its 80 % and 95 % bands covered closest to nominal (MAE ${round(winner.mae!)}, ${skill} % better than seasonal naive).`
          : `${winner.label} has the lowest MAE on the ${originCount} × ${horizon} h backtest (${round(winner.mae!)}, ${skill} % better than seasonal naive).`;
    }
  }
  for (const c of candidates) if (c.error) c.note = `left out: ${c.error}`;

  const table: FitCandidate[] = candidates.map((c) => ({
    label: c.label,
    method: c.method,
    p: c.fit?.p ?? 0,
    q: c.fit?.q ?? 0,
    aic: c.fit?.aic ?? null,
    bic: c.fit?.bic ?? null,
    backtestMae: c.mae,
    backtestRmse: c.rmse,
    backtestMape: c.mape,
    coverage80: c.coverage80,
    coverage95: c.coverage95,
    ljungBox: c.ljung,
    skill: c.mae === null || !(naiveMae > 0) ? null : 1 - c.mae / naiveMae,
    fitMs: Math.round(c.fitMs * 10) / 10,
    error: c.error,
    note: c.note,
    chosen: c === winner,
  }));
  table.push({
    label: 'seasonal naive (same hour last week)',
    method: 'seasonal-naive',
    p: 0,
    q: 0,
    aic: null,
    bic: null,
    backtestMae: origins.length ? naiveMae : null,
    backtestRmse: origins.length ? rootMeanSquare(naiveErrors) : null,
    backtestMape: null,
    coverage80: null,
    coverage95: null,
    ljungBox: null,
    skill: origins.length ? 0 : null,
    fitMs: 0,
    error: null,
    note: winner ? 'the benchmark: a model beat it' : null,
    chosen: winner === null,
  });
  const selection: FitSelection = {
    rule: 'lowest backtest MAE; within 2 % of it, residuals that pass the Ljung-Box screen, then bands covering closest to nominal; seasonal naive only when no model beats it',
    reason,
    backtest: { origins: origins.length, horizon },
    candidates: table,
  };
  if (!winner) return { model: fitLoadModel(seasonalNaiveSpec(design), data), method: 'seasonal-naive', selection, extended: null };
  return { model: modelAtOrigin(winner.extended!, n), method: winner.method, selection, extended: winner.extended };
}

/** The seasonal step and regressors of a design in plain words, e.g. "hour-of-week profile". */
export function describeDesign(design: ModelDesign): string {
  const s = design.seasonal;
  const step =
    s.kind === 'none'
      ? 'no seasonal step'
      : s.kind === 'difference'
        ? s.lag === 168
          ? 'weekly difference'
          : 'daily difference'
        : `${s.period === 168 ? 'hour-of-week' : 'hour-of-day'} profile${s.form === 'multiplicative' ? ' (multiplicative)' : ''}`;
  return design.log ? `${step} of log load` : step;
}

/** The AR order by AIC from one Levinson-Durbin pass (R's `ar()` criterion n·log σ²_p + 2p, Brockwell & Davis 2016 §5.5). */
export function yuleWalkerOrderByAic(x: ArrayLike<number>, maxP: number): number {
  const gamma = autocovariance(x, maxP);
  const { variances } = levinsonDurbin(gamma, maxP);
  const n = x.length;
  let best = 0;
  let bestAic = Infinity;
  for (let p = 0; p <= maxP; p++) {
    const aic = n * Math.log(variances[p]) + 2 * p;
    if (aic < bestAic) {
      bestAic = aic;
      best = p;
    }
  }
  return best;
}

/** z of the 80 % and 95 % Gaussian bands, computed once as predictionIntervals computes them. */
const BAND_Z = [80, 95].map((level) => normalQuantile(0.5 + level / 200));

/**
 * A modelling-scale forecast on the load scale with its 80 % and 95 % Gaussian bands, as forecastLoadModel
 * makes them: with logs the lognormal mean and the bounds exp(m ± z·s), otherwise m and m ± z·s.
 */
function loadScale(
  forecast: OriginForecast,
  log: boolean,
): { mean: ArrayLike<number>; intervals: Array<{ lower: Float64Array; upper: Float64Array }> } {
  const { mean, se } = forecast;
  const intervals = BAND_Z.map((z) => {
    const lower = new Float64Array(mean.length);
    const upper = new Float64Array(mean.length);
    for (let h = 0; h < mean.length; h++) {
      lower[h] = log ? Math.exp(mean[h] - z * se[h]) : mean[h] - z * se[h];
      upper[h] = log ? Math.exp(mean[h] + z * se[h]) : mean[h] + z * se[h];
    }
    return { lower, upper };
  });
  return { mean: log ? backTransformLog(mean, se).mean : mean, intervals };
}

/** CPU time of this process in milliseconds (the fit is synchronous, so this is the fit's own time). */
export function cpuMilliseconds(): number {
  const { user, system } = process.cpuUsage();
  return (user + system) / 1000;
}

/** True when the candidate's residuals fail Ljung-Box badly (see the file comment). */
function failsBadly(c: Candidate): boolean {
  return c.ljung !== null && c.ljung.pValue < 0.001 && c.ljung.statistic > BAD_Q_RATIO * c.ljung.df;
}

/** |c80 − 80| + |c95 − 95| in percentage points. */
function coverageGap(c: Candidate): number {
  return Math.abs(c.coverage80! - 80) + Math.abs(c.coverage95! - 95);
}

/** The design estimated as `auto` estimates every candidate's: regressors and profile by GLS with AR(2) errors. */
function fitDesign(design: ModelDesign, data: LoadSeriesData): FittedLoadModel {
  return fitLoadModel({ ...design, method: 'cmle', p: 2, q: 0 }, data);
}

/**
 * A candidate's configuration (`spec`: design, estimator, lags and penalty) estimated on `data` the way `auto`
 * estimated it: the design by fitDesign, then the ARMA part once on its remainder (with the spec's λ, if any).
 */
export function fitAsCandidate(spec: LoadModelSpec, data: LoadSeriesData): FittedLoadModel {
  const { method: _method, p: _p, q: _q, lags: _lags, lambda: _lambda, select: _select, ...design } = spec;
  const designModel = fitDesign(design, data);
  return withArma(designModel, fitArmaPart(spec, designModel.remainder));
}

/** The design model with another ARMA part fitted to the same remainder. */
function withArma(model: FittedLoadModel, fit: FitResult): FittedLoadModel {
  const regularised = fit as Partial<RegularisedFit>;
  const spec: LoadModelSpec = {
    ...model.spec,
    method: fit.method,
    p: fit.p,
    q: fit.q,
    ...(regularised.lags ? { lags: regularised.lags, lambda: regularised.lambda } : {}),
  };
  return { ...model, spec, arma: fit, residuals: fit.residuals };
}

/** Mean absolute value. */
function meanAbs(values: number[]): number {
  return values.reduce((sum, v) => sum + Math.abs(v), 0) / values.length;
}

/** Root mean square. */
function rootMeanSquare(values: number[]): number {
  return Math.sqrt(values.reduce((sum, v) => sum + v * v, 0) / values.length);
}

/** Four significant digits, for the reason text. */
function round(value: number): string {
  return Number(value.toPrecision(4)).toString();
}
