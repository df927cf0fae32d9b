/**
 * CSV cells per RFC 4180, safe to open in a spreadsheet: text that a spreadsheet would read as a
 * formula (starting with = + - @, or a tab or carriage return that some programs skip before one)
 * gets a leading apostrophe, after OWASP's guidance on CSV injection. Numbers are written as numbers.
 */

const formulaStart = /^[=+\-@\t\r]/;

/** A text cell: formula-neutralised, then quoted when it holds a comma, quote or line break. */
export function textCell(value: string | null | undefined): string {
  if (value === null || value === undefined) return '';
  const safe = formulaStart.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/**
 * A number cell, rounded to `decimals` places (default 4) with no trailing zeros; empty for null.
 * `decimals: null` writes the value exactly as stored (readings quoted back to a steward).
 */
export function numberCell(value: number | null | undefined, decimals: number | null = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '';
  if (decimals === null) return String(value);
  const scale = 10 ** decimals;
  const rounded = Math.round(value * scale) / scale;
  return String(Object.is(rounded, -0) ? 0 : rounded);
}

/** One CSV line (CRLF-terminated, as RFC 4180 asks) from cells already made with textCell/numberCell. */
export function csvLine(cells: readonly string[]): string {
  return `${cells.join(',')}\r\n`;
}
