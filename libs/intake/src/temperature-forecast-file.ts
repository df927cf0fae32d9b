/**
 * Reads a CSV file of temperature forecast issues: one row per valid hour, with the issue time, the valid hour
 * and the temperature in columns the steward names. Timestamps with an offset are taken as given; local ones
 * are read in the steward's time zone. The file is streamed with the upload reader's CSV records, timestamps
 * and numbers are read as the readings import reads them, and every row that cannot be read is named; the
 * store (libs/readings) checks each issue's hours against its station.
 */
import type { UploadLayout } from '@loadwright/contracts';
import { csvRecords } from './csv/record-source';
import { parseValueCell } from './csv/parse-number';
import { parseTimestamp } from './csv/parse-timestamp';
import { instantsForWallClock } from './time-zone-offset';
import { UploadRejection } from './upload-rejection';

/** Which columns hold what, and the zone of local times. */
export interface TemperatureForecastColumns {
  issuedAtColumn: string;
  validTimeColumn: string;
  valueColumn: string;
  timeZone: string;
}

/** One readable row: the valid hour's instant (UTC ms), its temperature as written, and its line in the file. */
export interface ForecastFileHour {
  ts: number;
  value: number;
  line: number;
}

/** What the file holds: rows grouped by issue time (UTC ms, in file order), and a sentence per unreadable row. */
export interface ForecastFileContents {
  issues: Map<number, ForecastFileHour[]>;
  rows: number;
  problems: string[];
}

/** Most unreadable rows named one by one; the rest are counted. */
const namedProblems = 20;

/** Reads every row of a forecast file; throws UploadRejection when a named column is not in the file. */
export async function readTemperatureForecastFile(
  path: string,
  layout: UploadLayout,
  columns: TemperatureForecastColumns,
): Promise<ForecastFileContents> {
  const index = (name: string) => {
    const at = layout.columns.indexOf(name);
    if (at < 0) throw new UploadRejection(`The file has no column "${name}"; choose one of ${layout.columns.join(', ')}.`);
    return at;
  };
  const issuedIndex = index(columns.issuedAtColumn);
  const validIndex = index(columns.validTimeColumn);
  const valueIndex = index(columns.valueColumn);
  if (new Set([issuedIndex, validIndex, valueIndex]).size < 3)
    throw new UploadRejection('Choose three different columns for the issue time, the valid hour and the temperature.');

  const issues = new Map<number, ForecastFileHour[]>();
  const problems: string[] = [];
  let unnamed = 0;
  const problem = (sentence: string) => (problems.length < namedProblems ? problems.push(sentence) : unnamed++);
  const instant = (text: string, line: number, column: string): number | null => {
    const parsed = parseTimestamp(text, layout.slashDateOrder === 'day-first');
    if (!parsed) {
      problem(`Row ${line}, ${column}: "${text}" is not a date and time.`);
      return null;
    }
    if (parsed.kind === 'instant') return parsed.ms;
    const found = instantsForWallClock(columns.timeZone, parsed.wallMs);
    if (found.length !== 1) {
      problem(
        `Row ${line}, ${column}: ${text} ${found.length === 0 ? 'does not exist' : 'occurs twice'} in ${columns.timeZone} (a daylight-saving change); write it with its UTC offset.`,
      );
      return null;
    }
    return found[0]!;
  };
  let rows = 0;
  let records = 0;
  for await (const batch of csvRecords(path, layout)) {
    for (let r = 0; r < batch.lines.length; r++) {
      if (records++ === 0 && layout.hasHeader) continue;
      rows++;
      const cells = batch.cells[r]!;
      const line = batch.lines[r]!;
      const issuedAt = instant(cells[issuedIndex] ?? '', line, columns.issuedAtColumn);
      const ts = instant(cells[validIndex] ?? '', line, columns.validTimeColumn);
      const cell = parseValueCell(cells[valueIndex] ?? '', layout.decimalSeparator);
      if (cell.kind !== 'number') problem(`Row ${line}, ${columns.valueColumn}: "${cells[valueIndex] ?? ''}" is not a temperature.`);
      if (issuedAt === null || ts === null || cell.kind !== 'number') continue;
      const hours = issues.get(issuedAt) ?? [];
      hours.push({ ts, value: cell.value, line });
      issues.set(issuedAt, hours);
    }
  }
  if (unnamed > 0) problems.push(`${unnamed} more rows cannot be read.`);
  if (rows === 0) problems.push('The file holds no data rows.');
  return { issues, rows, problems };
}
