/**
 * A first proposal of how a file maps onto the catalogue, from its column names and first rows:
 * a wide file when column names are series keys; a long file otherwise, with a series key column
 * when one column's values are series keys. Units come from the column names (kW, MWh, °F…) or the
 * series; time zone from the series; the interval convention from the timestamp column's name
 * (`hour_ending`) or 24:00 rows, else the series; slashed-date order from a row that decides it; the
 * file's own interval when its rows are finer than the series. Repeated daylight-saving hours are
 * placed by file order (`by-order`), which drops and reports what order cannot decide. Pure.
 */
import type { UploadLayout, UploadMapping, UploadPreview, UploadProposal, UploadUnit } from '@loadwright/contracts';
import type { CatalogueEntry } from './catalogue-entry';
import { parseValueCell } from './csv/parse-number';
import { parseTimestamp, slashedDateFields } from './csv/parse-timestamp';
import { every, readingMinutesFor } from './file-interval';
import { SeriesKeyIndex } from './series-key';

const timeLike = /time|date|stamp|interval|period|hour|^ts$|^when$/i;
const valueLike = /value|reading|load|demand|kwh|mwh|kw|mw|wh|temp|power|energy/i;
/** Column names that say the timestamps are interval ends ("hour_ending", "Interval End", "period end"). */
const endLike = /end(?:ing|s)?\b|_end|ending/i;
/** Column names that say the timestamps are interval starts ("interval_start", "hour beginning"). */
const startLike = /start|begin/i;

/** Proposes a mapping and settings for a previewed file. */
export function proposeMapping(
  layout: UploadLayout,
  preview: UploadPreview,
  catalogue: readonly CatalogueEntry[],
  fallbackTimeZone = 'UTC',
): UploadProposal {
  const notes: string[] = [];
  const byKey = new SeriesKeyIndex(catalogue);
  const column = (i: number) => preview.rows.map((row) => row[i] ?? '');
  const parsesAsTime = (i: number) =>
    column(i)
      .filter((cell) => cell.trim() !== '')
      .every((cell) => parseTimestamp(cell, layout.slashDateOrder === 'day-first') !== null);
  const numeric = (i: number) => column(i).some((cell) => parseValueCell(cell, layout.decimalSeparator).kind === 'number');

  const columns = layout.columns;
  let timestampIndex = columns.findIndex((name, i) => timeLike.test(name) && parsesAsTime(i));
  if (timestampIndex < 0) timestampIndex = columns.findIndex((_, i) => parsesAsTime(i));
  let mapping: UploadMapping | null = null;
  let mapped: CatalogueEntry[] = [];
  if (timestampIndex < 0) {
    notes.push('No column holds timestamps Loadwright reads; choose the timestamp column.');
  } else {
    const timestampColumn = columns[timestampIndex]!;
    const wide = columns.map((name, i) => ({ name, i, entry: byKey.find(name) })).filter((c) => c.entry && c.i !== timestampIndex);
    if (wide.length > 0) {
      mapping = {
        layout: 'wide',
        timestampColumn,
        seriesColumns: wide.map((c) => ({
          column: c.name,
          seriesKey: c.entry!.key,
          unit: unitFromName(c.name) ?? (c.entry!.unit as UploadUnit),
        })),
      };
      mapped = wide.map((c) => c.entry!);
      const unmatched = columns.filter((name, i) => i !== timestampIndex && !byKey.has(name));
      if (unmatched.length > 0) notes.push(`Columns not matched to a series and left out: ${unmatched.join(', ')}.`);
    } else {
      const keyIndex = columns.findIndex(
        (_, i) =>
          i !== timestampIndex && column(i).length > 0 && column(i).filter((cell) => byKey.has(cell)).length * 2 >= column(i).length,
      );
      const candidates = columns.map((name, i) => ({ name, i })).filter((c) => c.i !== timestampIndex && c.i !== keyIndex && numeric(c.i));
      const value = candidates.find((c) => valueLike.test(c.name)) ?? candidates[0];
      if (!value) notes.push('No column holds numbers; choose the value column.');
      if (keyIndex < 0) notes.push('No column holds series keys from the catalogue; choose the series this file belongs to.');
      if (value) {
        mapping = {
          layout: 'long',
          timestampColumn,
          valueColumn: value.name,
          seriesKeyColumn: keyIndex >= 0 ? columns[keyIndex]! : null,
          seriesKey: null,
        };
        if (keyIndex >= 0)
          mapped = [
            ...new Set(
              column(keyIndex)
                .map((cell) => byKey.find(cell))
                .filter((entry) => entry !== null),
            ),
          ];
      }
    }
  }

  const unitColumn = mapping?.layout === 'long' ? mapping.valueColumn : mapping?.layout === 'wide' ? mapping.seriesColumns[0]!.column : '';
  const unit = unitFromName(unitColumn) ?? (mapped[0]?.unit as UploadUnit | undefined) ?? 'kW';
  const first = mapped[0];
  if (layout.timestampsHaveOffset === false) notes.push('Timestamps carry no UTC offset: check the time zone they are read in.');

  const timestampColumn = mapping?.timestampColumn ?? '';
  let timestampsMark = first?.timestampsMark ?? 'start';
  if (endLike.test(timestampColumn) || layout.endOfDayStamps) {
    timestampsMark = 'end';
    notes.push(
      endLike.test(timestampColumn)
        ? `Column "${timestampColumn}" names interval ends, so its timestamps mark the end of each interval.`
        : 'The file writes midnight as 24:00, so its timestamps mark the end of each interval.',
    );
  } else if (startLike.test(timestampColumn)) {
    timestampsMark = 'start';
  }

  const slashed = preview.rows.some((row) => row.some((cell) => slashedDateFields(cell) !== null));
  if (slashed && !layout.slashDateOrder)
    notes.push('No row shows whether dates such as 3/9/2026 put the month or the day first: they are read month first; check.');

  const fileMinutes = layout.intervalMinutes ?? null;
  const differs = fileMinutes !== null && mapped.some((entry) => entry.intervalMinutes !== fileMinutes);
  if (differs) {
    const entry = mapped.find((e) => e.intervalMinutes !== fileMinutes)!;
    const fits = readingMinutesFor(entry, fileMinutes);
    notes.push(
      typeof fits === 'string'
        ? `${fits[0]!.toUpperCase()}${fits.slice(1)}.`
        : `The file holds one reading every ${every(fileMinutes)} and series "${entry.key}" one every ${every(entry.intervalMinutes)}: each of its intervals is stored as the mean demand of the file's readings in it, and an interval the file covers only in part is left out and reported.`,
    );
  }
  const mixed = layout.mixedIntervals ?? [];
  if (fileMinutes !== null && mixed.length > 0) {
    const others = mixed.map((other) => `every ${every(other.minutes)} in ${percent(other.share)}`).join(', ');
    notes.push(
      `The file mixes intervals: most readings come one every ${every(fileMinutes)}, but ${others} of the steps between them. Loadwright reads it as one reading every ${every(fileMinutes)}, and the import reports each series' steps at other intervals; check the file's interval.`,
    );
  }
  return {
    mapping,
    settings: {
      unit,
      timeZone: first?.timeZone ?? fallbackTimeZone,
      timestampsMark,
      repeatedHourPolicy: 'by-order',
      decimalSeparator: layout.decimalSeparator,
      estimateShortGaps: true,
      slashDateOrder: layout.slashDateOrder ?? 'month-first',
      fileIntervalMinutes: differs ? fileMinutes : null,
    },
    notes,
  };
}

/** The unit a column name states, e.g. "Load (kW)", "energy_kwh", "Temp °F". */
export function unitFromName(name: string): UploadUnit | null {
  const lower = name.toLowerCase();
  if (/\bkwh\b|_kwh\b/.test(lower)) return 'kWh';
  if (/\bwh\b|_wh\b/.test(lower)) return 'Wh';
  if (/\bmwh\b|_mwh\b/.test(lower)) return 'MWh';
  if (/\bmw\b|_mw\b/.test(lower)) return 'MW';
  if (/\bkw\b|_kw\b/.test(lower)) return 'kW';
  if (/°f|\bdegf\b|fahrenheit|_f\b/.test(lower)) return 'degF';
  if (/°c|\bdegc\b|celsius|_c\b/.test(lower)) return 'degC';
  if (/\bw\b|_w\b|watts?\b/.test(lower)) return 'W';
  return null;
}

/** A share as a whole percent, never "0 %" for a share above zero. */
function percent(share: number): string {
  return `${Math.max(1, Math.round(share * 100))} %`;
}
