/**
 * Streams an uploaded CSV file once, row by row (never whole in memory), and turns each row into
 * readings per series in the series' stored unit at UTC interval starts: timestamps with an offset
 * are taken as given, local ones are resolved in the upload's time zone (a spring-forward time that
 * does not exist, or a repeated fall-back time under the `reject` policy, drops the reading with a
 * finding), end-of-interval stamps move back one interval, units are converted. A cell that makes
 * the file unusable (a formula, a non-number, an impossible date) rejects the whole file with one
 * sentence naming its row and column.
 */
import { stat } from 'node:fs/promises';
import { qualityFlag } from '@loadwright/db';
import type { UploadLayout, UploadUnit } from '@loadwright/contracts';
import type { CatalogueEntry } from './catalogue-entry';
import { csvRecords } from './csv/record-source';
import { parseValueCell } from './csv/parse-number';
import { parseTimestamp, type ParsedTimestamp } from './csv/parse-timestamp';
import { unitConversion } from './csv/units';
import type { Finding } from './findings';
import type { ImportPlan } from './import-plan';
import { intervalGrid, type IntervalGrid } from './interval-grid';
import { ReadingColumns } from './reading-columns';
import { instantsForWallClock } from './time-zone-offset';
import { UploadRejection } from './upload-rejection';

/** Plausible reading years; a date outside them is a format mistake, not data. */
export const plausibleYears = { from: 1950, to: 2100 } as const;

/** Readings gathered for one series. */
export interface SeriesIntake {
  series: CatalogueEntry;
  readings: ReadingColumns;
}

/** What reading the file produced. */
export interface FileReadings {
  bySeries: Map<number, SeriesIntake>;
  /** Findings on rows dropped while reading (unknown series, daylight-saving times). */
  findings: Finding[];
  /** Data rows read. */
  rows: number;
  /** Readings dropped while reading. */
  rejected: number;
}

/** Per-series facts the hot loop needs, computed once. */
interface SeriesRoute {
  intake: SeriesIntake;
  convert: (value: number) => number;
  grid: IntervalGrid;
}

/** Reads the file at `path` following the plan; `onProgress` hears the fraction of bytes read. */
export async function readUploadFile(
  path: string,
  layout: UploadLayout,
  plan: ImportPlan,
  onProgress?: (fraction: number, rows: number) => Promise<void> | void,
): Promise<FileReadings> {
  const { settings } = plan;
  const bySeries = new Map<number, SeriesIntake>();
  const routes = new Map<string, SeriesRoute>();
  const findings: Finding[] = [];
  let rejected = 0;
  let rows = 0;
  const headerRows = layout.hasHeader ? 1 : 0;
  const columnName = (index: number) => plan.columns[index] ?? `column ${index + 1}`;

  const routeFor = (series: CatalogueEntry, line: number, column: string, unit: UploadUnit = settings.unit): SeriesRoute => {
    let route = routes.get(series.key);
    if (route) return route;
    const convert = unitConversion(unit, series.unit, series.intervalMinutes);
    if (typeof convert === 'string')
      throw new UploadRejection(`Row ${line}, column "${column}": unit ${unit} does not fit series "${series.key}": ${convert}.`);
    const intake = { series, readings: new ReadingColumns(4096) };
    bySeries.set(series.id, intake);
    route = { intake, convert, grid: intervalGrid(series.intervalMinutes, series.timeZone) };
    routes.set(series.key, route);
    return route;
  };

  // Timestamps repeat across the rows of a long file (one per series), so the last one is reused.
  let lastStampText = '';
  let lastStamp: ParsedTimestamp | null = null;
  let lastWall = Number.NaN;
  let lastInstants: number[] = [];
  const repeatedSeen = new Map<string, number>();

  const stampOf = (text: string, line: number): ParsedTimestamp => {
    if (text === lastStampText && lastStamp) return lastStamp;
    const stamp = parseTimestamp(text);
    const column = columnName(plan.timestampIndex);
    if (!stamp) {
      if (text.trim() === '') throw new UploadRejection(`Row ${line}, column "${column}" is empty; every row needs its timestamp.`);
      throw new UploadRejection(
        `Row ${line}, column "${column}": "${clip(text)}" is not a timestamp Loadwright reads; use ISO 8601 such as 2025-03-09T02:00:00-06:00 or 2025-03-09 02:00.`,
      );
    }
    if (stamp.year < plausibleYears.from || stamp.year > plausibleYears.to) {
      throw new UploadRejection(
        `Row ${line}, column "${column}": "${clip(text)}" lies outside the years ${plausibleYears.from} to ${plausibleYears.to}; check the date and its format.`,
      );
    }
    lastStampText = text;
    lastStamp = stamp;
    return stamp;
  };

  /** The UTC instant of one reading, or null when it was dropped with a finding. */
  const instantOf = (stamp: ParsedTimestamp, route: SeriesRoute, value: number, line: number): { ms: number; flags: number } | null => {
    let ms: number;
    let flags = 0;
    if (stamp.kind === 'instant') {
      ms = stamp.ms;
    } else {
      if (stamp.wallMs !== lastWall) {
        lastWall = stamp.wallMs;
        lastInstants = instantsForWallClock(settings.timeZone, stamp.wallMs);
      }
      const local = new Date(stamp.wallMs).toISOString().slice(0, 16).replace('T', ' ');
      const base = { seriesId: route.intake.series.id, value, sourceRow: line };
      if (lastInstants.length === 0) {
        findings.push({
          ...base,
          rule: 'dst_missing_hour',
          tsMs: null,
          detail: { local, timeZone: settings.timeZone, resolution: 'rejected' },
        });
        return null;
      }
      if (lastInstants.length === 2) {
        if (settings.repeatedHourPolicy === 'reject') {
          findings.push({
            ...base,
            rule: 'dst_repeated_hour',
            tsMs: null,
            detail: { local, timeZone: settings.timeZone, resolution: 'rejected' },
          });
          return null;
        }
        const key = `${route.intake.series.id}:${stamp.wallMs}`;
        const seen = repeatedSeen.get(key) ?? 0;
        repeatedSeen.set(key, seen + 1);
        ms = lastInstants[seen === 0 ? 0 : 1]!;
        flags = qualityFlag.dstAmbiguous;
        findings.push({
          ...base,
          rule: 'dst_repeated_hour',
          tsMs: ms,
          detail: {
            local,
            timeZone: settings.timeZone,
            resolution: seen === 0 ? 'daylight (first occurrence)' : 'standard (second occurrence)',
          },
        });
      } else {
        ms = lastInstants[0]!;
      }
    }
    if (settings.timestampsMark === 'end') ms = route.grid.instantOf(route.grid.indexOf(ms) - 1);
    return { ms, flags };
  };

  const valueOf = (text: string, line: number, index: number): number | null => {
    const cell = parseValueCell(text, settings.decimalSeparator);
    if (cell.kind === 'number') return cell.value;
    if (cell.kind === 'missing') return null;
    if (cell.kind === 'formula')
      throw new UploadRejection(
        `Row ${line}, column "${columnName(index)}": "${clip(text)}" looks like a spreadsheet formula, not a number; export the values rather than the formulas.`,
      );
    throw new UploadRejection(
      `Row ${line}, column "${columnName(index)}": "${clip(text)}" is not a number${settings.decimalSeparator === '.' && /^-?\d+,\d+$/.test(text.trim()) ? ' (the upload reads "." as decimal separator)' : ''}.`,
    );
  };

  const take = (route: SeriesRoute, stamp: ParsedTimestamp, raw: number, line: number) => {
    const value = route.convert(raw);
    const at = instantOf(stamp, route, value, line);
    if (!at) {
      rejected++;
      return;
    }
    route.intake.readings.push(at.ms, value, line, at.flags);
  };

  const size = Math.max(1, (await stat(path)).size);
  let bytes = 0;
  let records = 0;
  for await (const batch of csvRecords(path, layout, (read) => (bytes = read))) {
    for (let r = 0; r < batch.lines.length; r++) {
      const cells = batch.cells[r]!;
      const line = batch.lines[r]!;
      if (records++ < headerRows) continue;
      rows++;
      const stamp = stampOf(cells[plan.timestampIndex] ?? '', line);
      if (plan.long) {
        const { valueIndex, keyIndex } = plan.long;
        let series = plan.long.series;
        if (!series) {
          const key = (cells[keyIndex] ?? '').trim();
          series = plan.seriesByKey.get(key) ?? null;
          if (!series) {
            findings.push({
              rule: 'unknown_series',
              seriesId: null,
              tsMs: null,
              value: null,
              sourceRow: line,
              detail: { key: clip(key), column: columnName(keyIndex) },
            });
            rejected++;
            continue;
          }
        }
        const value = valueOf(cells[valueIndex] ?? '', line, valueIndex);
        if (value !== null) take(routeFor(series, line, columnName(keyIndex >= 0 ? keyIndex : valueIndex)), stamp, value, line);
      } else {
        for (const { index, series, unit } of plan.wide!) {
          const value = valueOf(cells[index] ?? '', line, index);
          if (value !== null) take(routeFor(series, line, columnName(index), unit), stamp, value, line);
        }
      }
    }
    await onProgress?.(bytes / size, rows);
  }
  await onProgress?.(1, rows);
  return { bySeries, findings, rows, rejected };
}

/** A cell shortened for a message. */
function clip(text: string): string {
  return text.length > 40 ? `${text.slice(0, 37)}…` : text;
}
