/**
 * `auto`: fits a lean candidate set on one shared design and picks one by a short rolling-origin
 * backtest against seasonal naive, with the information criterion as tie-break.
 *
 * The design (seasonal step, regressors, log) is estimated once, with AR(2) errors by conditional MLE
 * (enough to whiten the errors for the GLS step and a ninth of the cost of AR(6)), on all but the last
 * 3 × 24 hours; its remainder is then shared by every candidate: conditional-MLE AR with
 * the order chosen by AIC up to 6, then while the CPU budget lasts ridge AR over the daily and weekly
 * lags (1–3, 24, 25, 168: yesterday's and last week's level, cheap), NLS ARMA(2,1), and lasso AR over
 * lags 1–48 and 168 (the dearest; each starts only if its expected cost fits the remaining budget).
 * Each candidate forecasts the held-out hours from three origins, 24 hours
 * each, with its parameters fixed and the actuals up to each origin (temperatures as observed), and is
 * scored by MAE against seasonal naive on the same hours. Rule: the lowest MAE wins; candidates within
 * 2 % of it are separated by AIC (same remainder, so comparable); seasonal naive wins only when no
 * model beats it. The winner is carried over the held-out hours with its parameters fixed, so the
 * forecast starts at the last actual.
 */
import type { FitCandidate, FitSelection, FittedMethod } from '@loadwright/contracts';
import {
  cmleAr,
  fitArmaPart,
  fitLoadModel,
  forecastArma,
  forecastLoadModel,
  nlsArma,
  selectOrder,
  type FitResult,
  type FittedLoadModel,
  type LoadSeriesData,
} from '@loadwright/forecasting';
import { regularisedLags, seasonalNaiveSpec, type ModelDesign } from './model-plan';
import { extendModel, modelAtOrigin, type ExtendedModel } from './reanchor';
import { describeRefitError } from './refit-errors';

/** Settings of the candidate comparison. */
export interface AutoOptions {
  /** Forecast origins of the backtest (default 3). */
  origins?: number;
  /** Hours forecast from each origin (default 24). */
  horizon?: number;
  /** Largest AR order of the conditional-MLE candidate (default 6, capped by the settings). */
  maxArOrder?: number;
  /** CPU milliseconds the candidates may take: an optional one starts only if it should finish within it (default REFIT_AUTO_BUDGET_MS or 130). */
  budgetMs?: number;
  /** Milliseconds clock (default: this process's CPU time, so a busy machine does not shrink the set). */
  clock?: () => number;
}

/** What `auto` chose and the model to forecast with. */
export interface AutoChoice {
  /** The chosen model, carried to the last actual. */
  model: FittedLoadModel;
  method: FittedMethod;
  selection: FitSelection;
}

/** MAE ratio within which candidates count as tied and AIC decides. */
const TIE = 1.02;
/** Shortest estimation part that still leaves room for the backtest: five weeks. */
const MIN_ESTIMATION_HOURS = 840;

/** A candidate with its fitted ARMA part on the shared remainder. */
interface ModelCandidate {
  label: string;
  method: FittedMethod;
  fit: FitResult | null;
  fitMs: number;
  error: string | null;
}

/** Runs the comparison on `data` (see the file comment). */
export function autoSelect(design: ModelDesign, data: LoadSeriesData, options: AutoOptions = {}): AutoChoice {
  const clock = options.clock ?? cpuMilliseconds;
  const started = clock();
  const originCount = options.origins ?? 3;
  const horizon = options.horizon ?? 24;
  const budgetMs = options.budgetMs ?? Number(process.env['REFIT_AUTO_BUDGET_MS'] ?? 130);
  const n = data.values.length;
  const holdout = n - originCount * horizon >= MIN_ESTIMATION_HOURS ? originCount * horizon : 0;
  const m = n - holdout;
  const estimation = holdout === 0 ? data : sliceData(data, m);
  const maxP = Math.max(1, Math.min(6, options.maxArOrder ?? 6));

  const designModel = fitLoadModel({ ...design, method: 'cmle', p: Math.min(2, maxP), q: 0 }, estimation);
  const remainder = designModel.remainder;
  // The order by AIC from Yule-Walker fits (one autocovariance pass each), then one conditional-MLE fit.
  const order = selectOrder(remainder, { method: 'yule-walker', maxP, criterion: 'aic' });
  const candidates: ModelCandidate[] = [
    { label: `cmle AR(${order.best.p})`, method: 'cmle', fit: cmleAr(remainder, order.best.p), fitMs: clock() - started, error: null },
  ];
  // Expected CPU milliseconds of each optional candidate on a year of hourly data (measured on the
  // benchmark fleet), scaled by length: a candidate starts only if it should finish within the budget.
  const scale = remainder.length / 8760;
  const optional: Array<{ label: string; method: FittedMethod; costMs: number; run: () => FitResult }> = [
    {
      label: 'ridge AR (lags 1–3, 24, 25, 168)',
      method: 'ridge',
      costMs: 25,
      run: () => fitArmaPart({ method: 'ridge', p: 168, q: 0, lags: [1, 2, 3, 24, 25, 168], select: 'bic' }, remainder),
    },
    { label: 'NLS ARMA(2,1)', method: 'nls', costMs: 20, run: () => nlsArma(remainder, 2, 1) },
    {
      label: 'lasso AR (lags 1–48, 168)',
      method: 'lasso',
      costMs: 110,
      run: () => fitArmaPart({ method: 'lasso', p: 168, q: 0, lags: regularisedLags(48, [168]), select: 'bic' }, remainder),
    },
  ];
  for (const candidate of optional) {
    if (clock() - started + candidate.costMs * scale > budgetMs) {
      candidates.push({
        label: candidate.label,
        method: candidate.method,
        fit: null,
        fitMs: 0,
        error: `left out: the ${budgetMs} ms time budget was spent`,
      });
      continue;
    }
    const at = clock();
    try {
      candidates.push({ label: candidate.label, method: candidate.method, fit: candidate.run(), fitMs: clock() - at, error: null });
    } catch (error) {
      candidates.push({
        label: candidate.label,
        method: candidate.method,
        fit: null,
        fitMs: clock() - at,
        error: describeRefitError(error),
      });
    }
  }

  const naivePeriod = design.seasonal.kind === 'difference' ? design.seasonal.lag : 168;
  const origins = holdout === 0 ? [] : Array.from({ length: originCount }, (_, i) => m + i * horizon);
  const actual = (o: number, h: number) => data.values[o + h];
  const naiveErrors = origins.flatMap((o) =>
    Array.from({ length: horizon }, (_, h) => actual(o, h) - data.values[o + h - naivePeriod * Math.ceil((h + 1) / naivePeriod)]),
  );
  const naiveMae = meanAbs(naiveErrors);

  const scored = candidates.map((candidate) => {
    if (!candidate.fit) return { candidate, extended: null, mae: null, rmse: null };
    const extended = extendModel(withArma(designModel, candidate.fit), data);
    if (origins.length === 0) return { candidate, extended, mae: null, rmse: null };
    try {
      const errors = origins.flatMap((o) => {
        const mean = backtestMean(extended, o, horizon);
        return Array.from(mean, (value, h) => actual(o, h) - value);
      });
      return { candidate, extended, mae: meanAbs(errors), rmse: rootMeanSquare(errors) };
    } catch (error) {
      candidate.error = describeRefitError(error);
      return { candidate, extended: null, mae: null, rmse: null };
    }
  });

  const usable = scored.filter((s) => s.extended !== null);
  let winner: (typeof scored)[number] | null = null;
  let reason: string;
  if (origins.length === 0) {
    winner = [...usable].sort((a, b) => (a.candidate.fit!.aic ?? Infinity) - (b.candidate.fit!.aic ?? Infinity))[0] ?? null;
    reason = `The window is too short for a backtest (${n} hours); ${winner?.candidate.label ?? 'seasonal naive'} has the lowest AIC.`;
  } else {
    const best = Math.min(...usable.map((s) => s.mae!));
    const tied = usable
      .filter((s) => s.mae! <= best * TIE)
      .sort((a, b) => (a.candidate.fit!.aic ?? Infinity) - (b.candidate.fit!.aic ?? Infinity));
    winner = tied[0] ?? null;
    if (!winner || winner.mae! >= naiveMae) {
      reason = winner
        ? `No model beat seasonal naive on the ${originCount} × ${horizon} h backtest (best ${winner.candidate.label}: MAE ${round(winner.mae!)} against ${round(naiveMae)}).`
        : 'Every model candidate failed; seasonal naive is used.';
      winner = null;
    } else {
      const skill = Math.round((1 - winner.mae! / naiveMae) * 100);
      reason =
        tied.length > 1
          ? `${winner.candidate.label} has the lowest AIC among the candidates within 2 % of the best backtest MAE (${round(winner.mae!)}, ${skill} % better than seasonal naive).`
          : `${winner.candidate.label} has the lowest MAE on the ${originCount} × ${horizon} h backtest (${round(winner.mae!)}, ${skill} % better than seasonal naive).`;
    }
  }

  const table: FitCandidate[] = scored.map((s) => ({
    label: s.candidate.label,
    method: s.candidate.method,
    p: s.candidate.fit?.p ?? 0,
    q: s.candidate.fit?.q ?? 0,
    aic: s.candidate.fit?.aic ?? null,
    bic: s.candidate.fit?.bic ?? null,
    backtestMae: s.mae,
    backtestRmse: s.rmse,
    skill: s.mae === null || !(naiveMae > 0) ? null : 1 - s.mae / naiveMae,
    fitMs: Math.round(s.candidate.fitMs * 10) / 10,
    error: s.candidate.error,
    chosen: s === winner,
  }));
  table.push({
    label: 'seasonal naive',
    method: 'seasonal-naive',
    p: 0,
    q: 0,
    aic: null,
    bic: null,
    backtestMae: origins.length ? naiveMae : null,
    backtestRmse: origins.length ? rootMeanSquare(naiveErrors) : null,
    skill: origins.length ? 0 : null,
    fitMs: 0,
    error: null,
    chosen: winner === null,
  });
  const selection: FitSelection = {
    rule: 'lowest backtest MAE; within 2 % the lower AIC; seasonal naive only when no model beats it',
    reason,
    backtest: { origins: origins.length, horizon },
    candidates: table,
  };
  if (!winner) return { model: fitLoadModel(seasonalNaiveSpec(design), data), method: 'seasonal-naive', selection };
  return { model: modelAtOrigin(winner.extended!, n), method: winner.candidate.method, selection };
}

/**
 * Mean forecast of hours o+1..o+horizon from origin o with the parameters fixed. With an additive or no
 * seasonal step and no log, the deterministic part of hour t is transformed_t − remainder_t (profile and
 * regression on the observed regressors), so the forecast is that plus the ARMA forecast of the
 * remainder: exactly what forecastLoadModel computes, without rebuilding calendars and regressors for
 * every origin. Other designs go through forecastLoadModel.
 */
export function backtestMean(extended: ExtendedModel, origin: number, horizon: number): ArrayLike<number> {
  const { spec, arma } = extended.fitted;
  const additive = spec.seasonal.kind === 'none' || (spec.seasonal.kind === 'profile' && spec.seasonal.form === 'additive');
  if (!additive || spec.log) {
    const temperature = extended.data.temperature?.subarray(origin, origin + horizon);
    return forecastLoadModel(modelAtOrigin(extended, origin), { temperature }, horizon, []).mean;
  }
  const cut = origin - extended.remainderOffset;
  const part = forecastArma(arma!, extended.remainder.subarray(0, cut), horizon, extended.residuals.subarray(0, cut));
  return Array.from(part.mean, (value, h) => value + extended.transformed[origin + h] - extended.remainder[cut + h]);
}

/** CPU time of this process in milliseconds (the fit is synchronous, so this is the fit's own time). */
export function cpuMilliseconds(): number {
  const { user, system } = process.cpuUsage();
  return (user + system) / 1000;
}

/** The design model with another ARMA part fitted to the same remainder. */
function withArma(model: FittedLoadModel, fit: FitResult): FittedLoadModel {
  return { ...model, arma: fit, residuals: fit.residuals };
}

/** The first m hours of the data. */
function sliceData(data: LoadSeriesData, m: number): LoadSeriesData {
  return { timestamps: data.timestamps.subarray(0, m), values: data.values.subarray(0, m), temperature: data.temperature?.subarray(0, m) };
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
