/**
 * The model options every subcommand shares (`--method`, `--p`, `--q`, and `--lags`, `--lambda`,
 * `--select` for ridge and lasso), and the one place that dispatches a fit to the engine.
 */
import type { ParseArgsConfig } from 'node:util';
import { cmleAr, lassoAr, nlsArma, ridgeAr, yuleWalker, type FitMethod, type FitResult } from '@loadwright/forecasting';
import { InputError } from './input-error';
import { choiceOption, integerOption, lagsOption, numberOption } from './option-values';

/** The estimators the command offers, by the names the engine uses. */
export const fitMethods: readonly FitMethod[] = ['yule-walker', 'cmle', 'nls', 'ridge', 'lasso'];

/** parseArgs options for the input and the model. */
export const fitOptionConfig = {
  input: { type: 'string' },
  method: { type: 'string' },
  p: { type: 'string' },
  q: { type: 'string' },
  lags: { type: 'string' },
  lambda: { type: 'string' },
  select: { type: 'string' },
} as const satisfies ParseArgsConfig['options'];

/** What to fit, checked. */
export interface FitSpec {
  /** The estimator. */
  method: FitMethod;
  /** AR order (ridge and lasso: the largest lag). */
  p: number;
  /** MA order (nls only). */
  q: number;
  /** Ridge and lasso only: the lag set. */
  lags?: number[];
  /** Ridge and lasso only: a fixed penalty. */
  lambda?: number;
  /** Ridge and lasso only: how to choose the penalty. */
  select?: 'bic' | 'validation';
}

/** Reads and checks the model options. */
export function readFitSpec(values: Record<string, string | boolean | undefined>): FitSpec {
  const text = (name: string) => values[name] as string | undefined;
  const method = choiceOption('method', text('method'), fitMethods);
  const regularised = method === 'ridge' || method === 'lasso';
  if (!regularised && (text('lags') !== undefined || text('lambda') !== undefined || text('select') !== undefined)) {
    throw new InputError(`--lags, --lambda and --select apply to ridge and lasso only, not ${method}`);
  }
  const q = integerOption('q', text('q'), 0, 0);
  if (q > 0 && method !== 'nls') throw new InputError(`--q applies to nls only; ${method} fits pure AR models`);
  if (regularised) {
    const lags = text('lags') !== undefined ? lagsOption(text('lags')!) : undefined;
    const p = lags ? lags[lags.length - 1] : integerOption('p', text('p'), 1);
    const lambda = numberOption('lambda', text('lambda'), 0);
    if (lambda !== undefined && text('select') !== undefined) throw new InputError('give either --lambda or --select, not both');
    const select = text('select') !== undefined ? choiceOption('select', text('select'), ['bic', 'validation'] as const) : undefined;
    return { method, p, q: 0, lags: lags ?? Array.from({ length: p }, (_, i) => i + 1), lambda, select };
  }
  return { method, p: integerOption('p', text('p'), 0), q };
}

/** Fits the series with the chosen estimator. */
export function fitSeries(x: Float64Array, spec: FitSpec): FitResult {
  switch (spec.method) {
    case 'yule-walker':
      return yuleWalker(x, spec.p);
    case 'cmle':
      return cmleAr(x, spec.p);
    case 'nls':
      return nlsArma(x, spec.p, spec.q);
    case 'ridge':
      return ridgeAr(x, { lags: spec.lags!, lambda: spec.lambda, select: spec.select });
    case 'lasso':
      return lassoAr(x, { lags: spec.lags!, lambda: spec.lambda, select: spec.select });
  }
}
