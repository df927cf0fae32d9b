/**
 * Value cells. A number is plain decimal notation with an optional sign and exponent (1234.5, -0.3,
 * 1.2e3), with `,` as decimal separator when the upload says so (12,5 in semicolon files). Empty
 * cells and the usual missing-value markers (NA, N/A, NaN, null) are no reading. A cell that starts
 * like a spreadsheet formula (=, @, or + / − not followed by a number) is refused as a formula.
 */

/** What a value cell holds. */
export type ValueCell = { kind: 'number'; value: number } | { kind: 'missing' } | { kind: 'formula' } | { kind: 'invalid' };

const numberPattern = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const missingMarkers = new Set(['', 'na', 'n/a', 'nan', 'null']);

/** Reads one value cell. */
export function parseValueCell(text: string, decimalSeparator: '.' | ',' = '.'): ValueCell {
  // The common case first, without allocating: a plain number as written.
  if (decimalSeparator === '.' && numberPattern.test(text)) {
    const value = Number(text);
    return Number.isFinite(value) ? { kind: 'number', value } : { kind: 'invalid' };
  }
  const cell = text.trim();
  if (missingMarkers.has(cell.toLowerCase())) return { kind: 'missing' };
  const normal = decimalSeparator === ',' ? cell.replace(',', '.') : cell;
  if (numberPattern.test(normal)) {
    const value = Number(normal);
    return Number.isFinite(value) ? { kind: 'number', value } : { kind: 'invalid' };
  }
  if (/^[=@]/.test(cell) || /^[+-]/.test(cell)) return { kind: 'formula' };
  return { kind: 'invalid' };
}
