/**
 * Value cells. A number is plain decimal notation with an optional sign and exponent (1234.5, -0.3,
 * 1.2e3), with `,` as decimal separator when the upload says so (12,5 in semicolon files).
 * Thousands separators are read where they cannot be mistaken for a decimal mark: `1,499.6` (comma
 * groups, point decimal) in a point-decimal upload, `1.499,6` (point groups, comma decimal) in a
 * comma-decimal one. Empty cells are no reading; the usual missing-value markers (NA, N/A, NaN,
 * null) are no reading too, but the marker is returned so the import can say so per row. A cell
 * that starts like a spreadsheet formula (=, @, or + / − not followed by a number) is refused as a
 * formula.
 *
 * Conventions: values keep at most 12 significant digits, so that a value an exporting program
 * wrote with binary rounding noise (1347.1000000000001 from 1347100 Wh / 1000) is stored as written
 * by the meter (1347.1). No meter or historian records more than 12 significant digits.
 */

/** What a value cell holds. */
export type ValueCell =
  { kind: 'number'; value: number } | { kind: 'missing'; marker: string | null } | { kind: 'formula' } | { kind: 'invalid' };

/** Significant digits a value keeps (see Conventions). */
export const meterDigits = 12;

const numberPattern = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const commaGroups = /^[+-]?\d{1,3}(?:,\d{3})+(?:\.\d*)?$/;
const pointGroups = /^[+-]?\d{1,3}(?:\.\d{3})+,\d+$/;
const missingMarkers = new Set(['na', 'n/a', 'nan', 'null']);
const empty: ValueCell = { kind: 'missing', marker: null };

/** Reads one value cell. */
export function parseValueCell(text: string, decimalSeparator: '.' | ',' = '.'): ValueCell {
  // The common case first, without allocating: a plain number as written.
  if (decimalSeparator === '.' && numberPattern.test(text)) return numberOf(text);
  const cell = text.trim();
  if (cell === '') return empty;
  if (missingMarkers.has(cell.toLowerCase())) return { kind: 'missing', marker: cell };
  const normal = decimalSeparator === ',' ? cell.replace(',', '.') : cell;
  if (numberPattern.test(normal)) return numberOf(normal);
  if (decimalSeparator === '.' && commaGroups.test(cell)) return numberOf(cell.replaceAll(',', ''));
  if (decimalSeparator === ',' && pointGroups.test(cell)) return numberOf(cell.replaceAll('.', '').replace(',', '.'));
  if (/^[=@]/.test(cell) || /^[+-]/.test(cell)) return { kind: 'formula' };
  return { kind: 'invalid' };
}

/** The number a well-formed text holds, at most `meterDigits` significant digits. */
function numberOf(text: string): ValueCell {
  let value = Number(text);
  if (!Number.isFinite(value)) return { kind: 'invalid' };
  // Up to 13 characters hold at most 12 significant digits plus sign and point: nothing to round.
  if (text.length > meterDigits + 1) value = Number(value.toPrecision(meterDigits));
  return { kind: 'number', value };
}
