/**
 * Cells of CSV files Loadwright writes. Text that a spreadsheet would run as a formula (starting with
 * = + − @, tab or carriage return) gets a leading apostrophe, as the OWASP guidance on CSV injection
 * advises; every cell is quoted, with inner quotes doubled (RFC 4180).
 */

const formulaStart = /^[=+\-@\t\r]/;

/** One text cell, neutralised and quoted. */
export function csvText(text: string | null | undefined): string {
  if (text === null || text === undefined) return '';
  const safe = formulaStart.test(text) ? `'${text}` : text;
  return `"${safe.replace(/"/g, '""')}"`;
}

/** One number cell (numbers are never formulas and are written bare). */
export function csvNumber(value: number | null | undefined): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '' : String(value);
}

/** A CSV line from cells already formatted, ended by CRLF. */
export function csvLine(cells: string[]): string {
  return `${cells.join(',')}\r\n`;
}
