/**
 * Streams an uploaded CSV file once, row by row (never whole in memory), and turns each row into
 * readings per series in the series' stored unit at UTC interval starts: timestamps with an offset
 * are taken as given, local ones are resolved in the upload's time zone, end-of-interval stamps move
 * back one of the file's intervals, units are converted (energy by the file's own interval), and
 * readings finer than their series are combined into its intervals (see combine-intervals.ts).
 *
 * Local times: a spring-forward time that does not exist drops its reading with a finding. A time
 * that occurs twice when clocks fall back is placed by the repeated-hour policy; under `by-order`
 * the two readings of a series at that time are placed by their order in the file (daylight time
 * first) when the series' rows are in time order; otherwise the steward's choice for that hour is
 * applied, and without one the hour becomes a question the import stops to ask. A day with
 * an hour's readings too many in a zone that never changes its clocks refuses the file: its times
 * were written in another zone.
 *
 * A cell that makes the file unusable (a formula, a non-number, an impossible date, 24:00 read as an
 * interval start) rejects the whole file with one sentence naming its row and column. A marker such
 * as NaN stores no reading and says so per row; a value beyond any electric load (or below absolute
 * zero) is refused with its row and never stored.
 */
import { stat } from 'node:fs/promises';
import { qualityFlag } from '@loadwright/db';
import type { RepeatedHourChoiceKind, RepeatedHourQuestion, UploadLayout, UploadUnit } from '@loadwright/contracts';
import type { CatalogueEntry } from './catalogue-entry';
import { combineIntervals } from './combine-intervals';
import { csvRecords } from './csv/record-source';
import { parseValueCell } from './csv/parse-number';
import { parseTimestamp, type ParsedTimestamp } from './csv/parse-timestamp';
import { unitConversion } from './csv/units';
import { readingMinutesFor } from './file-interval';
import type { Finding } from './findings';
import type { ImportPlan } from './import-plan';
import { intervalGrid, type IntervalGrid } from './interval-grid';
import { ReadingColumns } from './reading-columns';
import { absurdRange } from './rules/physical-bounds';
import { instantsForWallClock, offsetMsAt } from './time-zone-offset';
import { UploadRejection } from './upload-rejection';

/** Plausible reading years; a date outside them is a format mistake, not data. */
export const plausibleYears = { from: 1950, to: 2100 } as const;

const dayMs = 86_400_000;

/** Readings gathered for one series. */
export interface SeriesIntake {
  series: CatalogueEntry;
  readings: ReadingColumns;
}

/** What reading the file produced. */
export interface FileReadings {
  bySeries: Map<number, SeriesIntake>;
  /** Findings on rows dropped while reading (unknown series, daylight-saving times, markers, absurd values). */
  findings: Finding[];
  /** Data rows read. */
  rows: number;
  /** Readings dropped while reading. */
  rejected: number;
  /** Repeated hours neither file order nor a choice of the steward places (policy `by-order`): nothing may be stored until answered. */
  questions: RepeatedHourQuestion[];
}

/** A reading in a repeated local hour, held until the whole file is read (policy `by-order`). */
interface HeldReading {
  wallMs: number;
  value: number;
  line: number;
}

/** Per-series facts the hot loop needs, computed once, and what it learns of the series' rows. */
interface SeriesRoute {
  intake: SeriesIntake;
  convert: (value: number) => number;
  grid: IntervalGrid;
  absurd: { low: number; high: number };
  /** Minutes each file reading covers (the series' interval unless the file is finer). */
  readingMinutes: number;
  /** Wall-clock time of the series' previous local-time row, and whether it lay in a repeated hour. */
  lastWall: number;
  lastRepeated: boolean;
  /** A local time went backwards other than into a repeated hour: file order says nothing. */
  outOfOrder: boolean;
  held: HeldReading[];
  /** Local-time readings per local day, kept only in zones that never change their clocks. */
  perDay: Map<number, { count: number; line: number }> | null;
  /** Instant of the series' previous reading, and the steps since seen at other intervals than the file's. */
  lastMs: number;
  otherSteps: Map<number, number>;
  firstOtherLine: number;
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
  const routes = new Map<number, SeriesRoute>();
  const findings: Finding[] = [];
  let rejected = 0;
  let rows = 0;
  const headerRows = layout.hasHeader ? 1 : 0;
  const columnName = (index: number) => plan.columns[index] ?? `column ${index + 1}`;
  const policy = settings.repeatedHourPolicy;
  const zoneKeepsOneOffset = !changesClocks(settings.timeZone);

  const routeFor = (series: CatalogueEntry, line: number, column: string, unit: UploadUnit = settings.unit): SeriesRoute => {
    let route = routes.get(series.id);
    if (route) return route;
    const readingMinutes = readingMinutesFor(series, plan.fileIntervalMinutes);
    if (typeof readingMinutes === 'string') throw new UploadRejection(`Row ${line}, column "${column}": ${readingMinutes}.`);
    const convert = unitConversion(unit, series.unit, readingMinutes);
    if (typeof convert === 'string')
      throw new UploadRejection(`Row ${line}, column "${column}": unit ${unit} does not fit series "${series.key}": ${convert}.`);
    const intake = { series, readings: new ReadingColumns(4096) };
    bySeries.set(series.id, intake);
    route = {
      intake,
      convert,
      grid: intervalGrid(series.intervalMinutes, series.timeZone),
      absurd: absurdRange(series),
      readingMinutes,
      lastWall: Number.NEGATIVE_INFINITY,
      lastRepeated: false,
      outOfOrder: false,
      held: [],
      perDay: zoneKeepsOneOffset ? new Map() : null,
      lastMs: Number.NaN,
      otherSteps: new Map(),
      firstOtherLine: 0,
    };
    routes.set(series.id, route);
    return route;
  };

  // Timestamps repeat across the rows of a long file (one per series), so the last one is reused.
  let lastStampText = '';
  let lastStamp: ParsedTimestamp | null = null;
  let lastWall = Number.NaN;
  let lastInstants: number[] = [];
  const repeatedSeen = new Map<string, number>();
  // Long files repeat each key over many rows, so the last lookup is reused.
  let lastKeyText: string | null = null;
  let lastKeySeries: CatalogueEntry | null = null;

  const stampOf = (text: string, line: number): ParsedTimestamp => {
    if (text === lastStampText && lastStamp) return lastStamp;
    const stamp = parseTimestamp(text, plan.dayFirst);
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
    if (settings.timestampsMark === 'start' && /(?:^|[T\s])24:00(?::00)?$/.test(text.trim())) {
      throw new UploadRejection(
        `Row ${line}, column "${column}": "${clip(text)}" is midnight written as the end of a day, which only an interval's end can be; set timestamps to mark the end of each interval and upload the file again.`,
      );
    }
    lastStampText = text;
    lastStamp = stamp;
    return stamp;
  };

  /** Moves an interval-end instant back to its interval's start. */
  const startOf = (route: SeriesRoute, ms: number) =>
    settings.timestampsMark !== 'end'
      ? ms
      : route.readingMinutes === route.grid.intervalMinutes
        ? route.grid.instantOf(route.grid.indexOf(ms) - 1)
        : ms - route.readingMinutes * 60_000;

  /**
   * The UTC instant of one reading; null when it was dropped with a finding, 'held' when it waits
   * for the end of the file to be placed by order.
   */
  const instantOf = (
    stamp: ParsedTimestamp,
    route: SeriesRoute,
    value: number,
    line: number,
  ): { ms: number; flags: number } | null | 'held' => {
    if (stamp.kind === 'instant') return { ms: startOf(route, stamp.ms), flags: 0 };
    if (stamp.wallMs !== lastWall) {
      lastWall = stamp.wallMs;
      lastInstants = instantsForWallClock(settings.timeZone, stamp.wallMs);
    }
    const repeated = lastInstants.length === 2;
    if (stamp.wallMs < route.lastWall && !(repeated && route.lastRepeated)) route.outOfOrder = true;
    route.lastWall = stamp.wallMs;
    route.lastRepeated = repeated;
    if (route.perDay) {
      // An interval-end stamp of 24:00 (or 00:00) closes the day before.
      const day = Math.floor((stamp.wallMs - (settings.timestampsMark === 'end' ? 1 : 0)) / dayMs);
      const seen = route.perDay.get(day);
      if (seen) seen.count++;
      else route.perDay.set(day, { count: 1, line });
    }
    const local = localText(stamp.wallMs);
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
    if (!repeated) return { ms: startOf(route, lastInstants[0]!), flags: 0 };
    if (policy === 'reject') {
      findings.push({
        ...base,
        rule: 'dst_repeated_hour',
        tsMs: null,
        detail: { local, timeZone: settings.timeZone, resolution: 'rejected' },
      });
      return null;
    }
    if (policy === 'by-order') {
      route.held.push({ wallMs: stamp.wallMs, value, line });
      return 'held';
    }
    const key = `${route.intake.series.id}:${stamp.wallMs}`;
    const seen = repeatedSeen.get(key) ?? 0;
    repeatedSeen.set(key, seen + 1);
    const ms = lastInstants[seen === 0 ? 0 : 1]!;
    findings.push({
      ...base,
      rule: 'dst_resolved',
      tsMs: ms,
      detail: {
        local,
        timeZone: settings.timeZone,
        resolution: seen === 0 ? 'daylight (first occurrence)' : 'standard (second occurrence)',
      },
    });
    return { ms: startOf(route, ms), flags: qualityFlag.dstAmbiguous };
  };

  /** The value of a cell, or null when it holds none (a marker such as NaN gets a finding once the series is known). */
  const valueOf = (text: string, line: number, index: number): { value: number | null; marker: string | null } => {
    const cell = parseValueCell(text, settings.decimalSeparator);
    if (cell.kind === 'number') return { value: cell.value, marker: null };
    if (cell.kind === 'missing') return { value: null, marker: cell.marker };
    if (cell.kind === 'formula')
      throw new UploadRejection(
        `Row ${line}, column "${columnName(index)}": "${clip(text)}" looks like a spreadsheet formula, not a number; export the values rather than the formulas.`,
      );
    throw new UploadRejection(
      `Row ${line}, column "${columnName(index)}": "${clip(text)}" is not a number${settings.decimalSeparator === '.' && /^-?\d+,\d+$/.test(text.trim()) ? ' (the upload reads "." as decimal separator)' : ''}.`,
    );
  };

  const take = (
    route: SeriesRoute,
    stamp: ParsedTimestamp,
    cell: { value: number | null; marker: string | null },
    line: number,
    index: number,
  ) => {
    const seriesId = route.intake.series.id;
    if (cell.value === null) {
      if (cell.marker === null) return;
      findings.push({
        rule: 'unparseable',
        seriesId,
        tsMs: null,
        value: null,
        sourceRow: line,
        detail: { column: columnName(index), cell: clip(cell.marker), resolution: 'no reading stored' },
      });
      return;
    }
    const value = route.convert(cell.value);
    if (value < route.absurd.low || value > route.absurd.high) {
      rejected++;
      findings.push({
        rule: 'impossible',
        seriesId,
        tsMs: null,
        value: null,
        sourceRow: line,
        detail: {
          column: columnName(index),
          cell: clip(cell.value.toString()),
          low: route.absurd.low,
          high: route.absurd.high,
          unit: route.intake.series.unit,
          resolution: 'row refused, not stored',
        },
      });
      return;
    }
    const at = instantOf(stamp, route, value, line);
    if (at === 'held') return;
    if (!at) {
      rejected++;
      return;
    }
    if (at.ms !== route.lastMs) {
      noteStep(route, Math.abs(at.ms - route.lastMs), line);
      route.lastMs = at.ms;
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
        // The cell's own problem (a formula, a word) is reported before an unknown series key.
        const value = valueOf(cells[valueIndex] ?? '', line, valueIndex);
        let series = plan.long.series;
        if (!series) {
          const key = cells[keyIndex] ?? '';
          if (key !== lastKeyText) {
            lastKeyText = key;
            lastKeySeries = plan.seriesByKey.find(key);
          }
          series = lastKeySeries;
          if (!series) {
            findings.push({
              rule: 'unknown_series',
              seriesId: null,
              tsMs: null,
              value: null,
              sourceRow: line,
              detail: { key: clip(key.trim()), column: columnName(keyIndex) },
            });
            rejected++;
            continue;
          }
        }
        take(routeFor(series, line, columnName(keyIndex >= 0 ? keyIndex : valueIndex)), stamp, value, line, valueIndex);
      } else {
        for (const { index, series, unit } of plan.wide!) {
          const value = valueOf(cells[index] ?? '', line, index);
          take(routeFor(series, line, columnName(index), unit), stamp, value, line, index);
        }
      }
    }
    await onProgress?.(bytes / size, rows);
  }

  const choices = new Map<string, RepeatedHourChoiceKind>();
  for (const { seriesKey, local, choice } of settings.repeatedHourChoices ?? [])
    choices.set(choiceKey(plan.seriesByKey.find(seriesKey)?.key ?? seriesKey, local), choice);
  const questions: RepeatedHourQuestion[] = [];
  for (const route of routes.values()) {
    reportOtherSteps(route, findings);
    refuseLongDays(route, settings.timeZone);
    rejected += placeHeld(route, settings.timeZone, { findings, choices, questions }, startOf);
    if (route.readingMinutes < route.grid.intervalMinutes) {
      const combined = combineIntervals(route.intake.readings, route.intake.series.id, route.grid, route.readingMinutes);
      route.intake.readings = combined.readings;
      findings.push(...combined.findings);
      rejected += combined.dropped;
    }
  }
  await onProgress?.(1, rows);
  return { bySeries, findings, rows, rejected, questions };
}

/** How a choice is looked up: the catalogue's series key and the local time. */
function choiceKey(seriesKey: string, local: string): string {
  return `${seriesKey}\u0000${local}`;
}

/** Where placing the held readings reports to: findings, the steward's choices, and the questions still open. */
interface Placement {
  findings: Finding[];
  choices: ReadonlyMap<string, RepeatedHourChoiceKind>;
  questions: RepeatedHourQuestion[];
}

/**
 * Places the held readings of repeated local hours (policy `by-order`): of two readings at one
 * repeated time the first in the file is daylight time and the second standard time; a third is kept
 * as a repeat of the second (and collapsed as a duplicate later). When order cannot decide (a time
 * held only once, or the series' rows out of time order) the steward's choice for that hour places or
 * drops it; without a choice the hour becomes a question and its readings wait. Returns the readings
 * dropped.
 */
function placeHeld(
  route: SeriesRoute,
  timeZone: string,
  { findings, choices, questions }: Placement,
  startOf: (route: SeriesRoute, ms: number) => number,
): number {
  if (route.held.length === 0) return 0;
  const { id: seriesId, key: seriesKey, unit } = route.intake.series;
  const byWall = new Map<number, HeldReading[]>();
  for (const reading of route.held) {
    const group = byWall.get(reading.wallMs);
    if (group) group.push(reading);
    else byWall.set(reading.wallMs, [reading]);
  }
  let dropped = 0;
  const placed: Array<{ ms: number; reading: HeldReading }> = [];
  for (const [wallMs, group] of byWall) {
    const local = localText(wallMs);
    const [daylight, standard] = instantsForWallClock(timeZone, wallMs) as [number, number];
    const decidedByOrder = !route.outOfOrder && group.length > 1;
    const choice = decidedByOrder ? 'first-is-daylight' : choices.get(choiceKey(seriesKey, local));
    if (choice === undefined) {
      questions.push({
        seriesKey,
        local,
        timeZone,
        reason: route.outOfOrder ? 'rows-out-of-order' : 'single-reading',
        daylightStart: new Date(startOf(route, daylight)).toISOString(),
        standardStart: new Date(startOf(route, standard)).toISOString(),
        readings: group.map((reading) => ({ sourceRow: reading.line, value: reading.value })),
        unit,
      });
      continue;
    }
    if (choice === 'drop') {
      for (const reading of group) {
        dropped++;
        findings.push({
          rule: 'dst_repeated_hour',
          seriesId,
          tsMs: null,
          value: reading.value,
          sourceRow: reading.line,
          detail: { local, timeZone, resolution: 'dropped, as the steward chose' },
        });
      }
      continue;
    }
    // The reading that is daylight time comes first in the file unless the steward said it is the second.
    const daylightIndex = choice === 'first-is-daylight' ? 0 : 1;
    group.forEach((reading, k) => {
      const isDaylight = k === daylightIndex;
      const ms = isDaylight ? daylight : standard;
      const position = `${k === 0 ? 'first' : 'second'} in the file`;
      const why = decidedByOrder ? position : group.length === 1 ? 'as the steward chose' : `${position}, as the steward chose`;
      placed.push({ ms, reading });
      findings.push({
        rule: 'dst_resolved',
        seriesId,
        tsMs: ms,
        value: reading.value,
        sourceRow: reading.line,
        detail: {
          local,
          timeZone,
          resolution: `${isDaylight ? 'daylight' : 'standard'} time (${why})`,
        },
      });
    });
  }
  placed.sort((a, b) => a.reading.line - b.reading.line);
  for (const { ms, reading } of placed)
    route.intake.readings.push(startOf(route, ms), reading.value, reading.line, qualityFlag.dstAmbiguous);
  return dropped;
}

/** Counts a step between two of a series' readings that is shorter than the file's interval or no whole multiple of it (a longer multiple is a gap). */
function noteStep(route: SeriesRoute, stepMs: number, line: number): void {
  const intervalMs = route.readingMinutes * 60_000;
  if (Number.isNaN(stepMs) || (stepMs >= intervalMs && stepMs % intervalMs === 0)) return; // NaN: the series' first reading
  const minutes = Math.round(stepMs / 60_000);
  route.otherSteps.set(minutes, (route.otherSteps.get(minutes) ?? 0) + 1);
  if (route.firstOtherLine === 0) route.firstOtherLine = line;
}

/** One finding per series whose readings mix intervals: the steps seen, most common first, and the first row. */
function reportOtherSteps(route: SeriesRoute, findings: Finding[]): void {
  if (route.otherSteps.size === 0) return;
  const steps = [...route.otherSteps].sort((a, b) => b[1] - a[1] || a[0] - b[0]);
  findings.push({
    rule: 'mixed_interval',
    seriesId: route.intake.series.id,
    tsMs: null,
    value: null,
    sourceRow: route.firstOtherLine,
    detail: {
      fileIntervalMinutes: route.readingMinutes,
      otherSteps: steps
        .slice(0, 5)
        .map(([minutes, count]) => `${minutes} min × ${count}`)
        .join(', '),
      count: steps.reduce((sum, [, count]) => sum + count, 0),
    },
  });
}

/**
 * Refuses the file when a series has a local day with an hour's readings too many (25 hourly rows)
 * in a zone that never changes its clocks: the times were written in a zone with daylight saving.
 */
function refuseLongDays(route: SeriesRoute, timeZone: string): void {
  if (!route.perDay) return;
  const perHour = 60 / route.readingMinutes;
  if (!Number.isInteger(perHour)) return;
  for (const [day, { count, line }] of route.perDay) {
    if (count !== 25 * perHour) continue;
    const date = new Date(day * dayMs).toISOString().slice(0, 10);
    throw new UploadRejection(
      `Series "${route.intake.series.key}" has 25 hours of readings on ${date} (from row ${line}), as a day has when clocks fall back, but ${timeZone} keeps one UTC offset all year: the file's times were written in a zone with daylight saving. Choose the zone the file was written in and upload it again.`,
    );
  }
}

/** True when the zone's UTC offset changes during the year (daylight saving), checked this year and last. */
function changesClocks(timeZone: string): boolean {
  const year = new Date().getUTCFullYear();
  for (const y of [year, year - 1]) {
    const offsets = new Set([0, 2, 4, 6, 8, 10].map((month) => offsetMsAt(timeZone, Date.UTC(y, month, 1))));
    if (offsets.size > 1) return true;
  }
  return false;
}

/** A local wall-clock time as the findings write it: 2026-11-01 01:00. */
function localText(wallMs: number): string {
  return new Date(wallMs).toISOString().slice(0, 16).replace('T', ' ');
}

/** A cell shortened for a message. */
function clip(text: string): string {
  return text.length > 40 ? `${text.slice(0, 37)}…` : text;
}
