/**
 * `loadwright select --method M --max-p P [--max-q Q] [--criterion aic|aicc|bic] [--budget-ms T]`:
 * fits every order in the grid and prints the table ranked by the criterion, best first.
 */
import { selectOrder } from '@loadwright/forecasting';
import { loadInputSeries, parseOptions, type Command } from './command-context';
import { fitJson } from './fit-json';
import { InputError } from './input-error';
import { choiceOption, integerOption, numberOption } from './option-values';

/** Runs `select`. */
export const selectCommand: Command = async (context) => {
  const values = parseOptions(context.args, {
    input: { type: 'string' },
    method: { type: 'string' },
    'max-p': { type: 'string' },
    'max-q': { type: 'string' },
    criterion: { type: 'string' },
    'budget-ms': { type: 'string' },
  });
  const method = choiceOption('method', values.method, ['yule-walker', 'cmle', 'nls'] as const);
  const maxP = integerOption('max-p', values['max-p'], 0);
  const maxQ = integerOption('max-q', values['max-q'], 0, 0);
  if (maxQ > 0 && method !== 'nls') throw new InputError(`--max-q applies to nls only; ${method} fits pure AR models`);
  const criterion = choiceOption('criterion', values.criterion, ['aic', 'aicc', 'bic'] as const, 'aic');
  const budgetMs = numberOption('budget-ms', values['budget-ms'], 0);
  const series = await loadInputSeries(values.input, context);
  const selection = selectOrder(series.values, { method, maxP, maxQ, criterion, budgetMs });
  return { method, criterion, best: fitJson(selection.best), table: selection.table, skipped: selection.skipped };
};
