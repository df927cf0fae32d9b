/**
 * A first guess at which columns of a forecast file hold the issue time, the valid hour and the temperature,
 * and the unit, from the header's words; the steward confirms or changes every choice.
 */

/** The guessed columns (null where no header says) and unit. */
export interface ForecastColumnGuess {
  issuedAtColumn: string | null;
  validTimeColumn: string | null;
  valueColumn: string | null;
  unit: 'degC' | 'degF' | null;
}

const issuedWords = /issue|issued|made|run|created|published/i;
const validWords = /valid|target|forecast.?time|for.?hour|hour|time|timestamp|date/i;
const valueWords = /temp|°|deg|air|value/i;

/** Guesses from column names: an issue column, then a time column other than it, then a temperature column. */
export function guessForecastColumns(columns: readonly string[]): ForecastColumnGuess {
  const issuedAtColumn = columns.find((column) => issuedWords.test(column)) ?? null;
  const validTimeColumn = columns.find((column) => column !== issuedAtColumn && validWords.test(column)) ?? null;
  const valueColumn = columns.find((column) => column !== issuedAtColumn && column !== validTimeColumn && valueWords.test(column)) ?? null;
  const unit = valueColumn
    ? /(^|[^a-z])(c|degc|celsius)([^a-z]|$)|°c/i.test(valueColumn)
      ? 'degC'
      : /(^|[^a-z])(f|degf|fahrenheit)([^a-z]|$)|°f/i.test(valueColumn)
        ? 'degF'
        : null
    : null;
  return { issuedAtColumn, validTimeColumn, valueColumn, unit };
}
