/**
 * Checks a confirmed mapping against the file's columns, first rows and the catalogue, and turns it
 * into a plan the import follows. A mapping that does not fit gets one sentence naming the column.
 */
import type { UploadLayout, UploadMapping, UploadPreview, UploadSettings, UploadUnit } from '@loadwright/contracts';
import type { CatalogueEntry } from './catalogue-entry';
import { parseValueCell } from './csv/parse-number';
import { parseTimestamp } from './csv/parse-timestamp';
import { isKnownTimeZone } from './time-zone-offset';
import { unitConversion } from './csv/units';
import { readingMinutesFor } from './file-interval';
import { SeriesKeyIndex } from './series-key';

/** Where each reading comes from in a row. */
export interface ImportPlan {
  settings: UploadSettings;
  columns: string[];
  timestampIndex: number;
  /** Long files: the value column and either the key column or the one series. */
  long: { valueIndex: number; keyIndex: number; series: CatalogueEntry | null } | null;
  /** Wide files: each value column, its series and its unit. */
  wide: Array<{ index: number; series: CatalogueEntry; unit: UploadUnit }> | null;
  /** The catalogue by key (case-insensitive, see series-key.ts), for long files with a key column. */
  seriesByKey: SeriesKeyIndex;
  /** Slashed dates read day first (13/3/2026). */
  dayFirst: boolean;
  /** Minutes between the file's readings: the steward's setting, else the step seen in the first rows; null when neither says. */
  fileIntervalMinutes: number | null;
}

/** The plan, or the sentence saying why the mapping does not fit. */
export function planImport(
  mapping: UploadMapping,
  settings: UploadSettings,
  layout: UploadLayout,
  preview: UploadPreview,
  catalogue: readonly CatalogueEntry[],
): { ok: true; plan: ImportPlan } | { ok: false; message: string } {
  const columns = layout.columns;
  const fail = (message: string) => ({ ok: false as const, message });
  const indexOf = (name: string) => columns.indexOf(name);
  const missing = (role: string, name: string) =>
    fail(
      `The mapping names ${role} column "${name}", which the file does not have; its columns are ${columns.map((c) => `"${c}"`).join(', ')}.`,
    );
  const row = (k: number) => k + (layout.hasHeader ? 2 : 1);
  const seriesByKey = new SeriesKeyIndex(catalogue);
  if (!isKnownTimeZone(settings.timeZone))
    return fail(`Time zone "${settings.timeZone}" is not an IANA name; use one such as America/Chicago.`);

  const timestampIndex = indexOf(mapping.timestampColumn);
  if (timestampIndex < 0) return missing('timestamp', mapping.timestampColumn);
  const dayFirst = (settings.slashDateOrder ?? 'month-first') === 'day-first';
  const badStamp = preview.rows.findIndex(
    (cells) => (cells[timestampIndex] ?? '').trim() !== '' && parseTimestamp(cells[timestampIndex] ?? '', dayFirst) === null,
  );
  if (badStamp >= 0) {
    const cell = preview.rows[badStamp]![timestampIndex]!;
    if (parseTimestamp(cell, !dayFirst))
      return fail(
        `Row ${row(badStamp)}, column "${mapping.timestampColumn}": "${cell}" is a date only when read ${dayFirst ? 'month' : 'day'} first; set slashed dates to ${dayFirst ? 'month-first' : 'day-first'}.`,
      );
    return fail(
      `Row ${row(badStamp)}, column "${mapping.timestampColumn}": "${cell}" is not a timestamp, so this column cannot be the timestamp column.`,
    );
  }
  if (layout.endOfDayStamps && settings.timestampsMark === 'start')
    return fail(
      `Column "${mapping.timestampColumn}" writes midnight as 24:00, which only an interval's end can be; set timestamps to mark the end of each interval.`,
    );
  const fileIntervalMinutes = settings.fileIntervalMinutes ?? layout.intervalMinutes ?? null;
  const checkInterval = (series: CatalogueEntry) => {
    const minutes = readingMinutesFor(series, fileIntervalMinutes);
    return typeof minutes === 'string' ? fail(`${minutes[0]!.toUpperCase()}${minutes.slice(1)}.`) : null;
  };

  const checkValues = (index: number) => {
    const cells = preview.rows.map((cells) => cells[index] ?? '');
    if (cells.some((cell) => parseValueCell(cell, settings.decimalSeparator).kind === 'number')) return null;
    const k = cells.findIndex((cell) => cell.trim() !== '');
    return fail(
      `Column "${columns[index]}" holds no numbers${k >= 0 ? ` (row ${row(k)} reads "${cells[k]}")` : ''}; map the column that holds the readings.`,
    );
  };
  const checkUnit = (series: CatalogueEntry, unit: UploadUnit = settings.unit) => {
    const intervalProblem = checkInterval(series);
    if (intervalProblem) return intervalProblem;
    const conversion = unitConversion(unit, series.unit, series.intervalMinutes);
    return typeof conversion === 'string' ? fail(`Unit ${unit} does not fit series "${series.key}": ${conversion}.`) : null;
  };

  if (mapping.layout === 'long') {
    const valueIndex = indexOf(mapping.valueColumn);
    if (valueIndex < 0) return missing('value', mapping.valueColumn);
    if (valueIndex === timestampIndex) return fail(`Column "${mapping.valueColumn}" cannot be both the timestamp and the value column.`);
    const valueProblem = checkValues(valueIndex);
    if (valueProblem) return valueProblem;
    if ((mapping.seriesKeyColumn === null) === (mapping.seriesKey === null)) {
      return fail('Name either the column that holds series keys or the one series the whole file belongs to (not both).');
    }
    let keyIndex = -1;
    let series: CatalogueEntry | null = null;
    if (mapping.seriesKeyColumn !== null) {
      keyIndex = indexOf(mapping.seriesKeyColumn);
      if (keyIndex < 0) return missing('series key', mapping.seriesKeyColumn);
      if (keyIndex === valueIndex || keyIndex === timestampIndex)
        return fail(`Column "${mapping.seriesKeyColumn}" cannot be the series key column and another column at once.`);
      for (const [k, cells] of preview.rows.entries()) {
        const entry = seriesByKey.find(cells[keyIndex] ?? '');
        if (entry) {
          const unitProblem = checkUnit(entry);
          if (unitProblem) return fail(`Row ${row(k)}, column "${mapping.seriesKeyColumn}": ${unitProblem.message}`);
        }
      }
    } else {
      series = seriesByKey.find(mapping.seriesKey!);
      if (!series) return fail(`Series "${mapping.seriesKey}" is not in the catalogue; create it first or choose another.`);
      const unitProblem = checkUnit(series);
      if (unitProblem) return unitProblem;
    }
    return {
      ok: true,
      plan: {
        settings,
        columns,
        timestampIndex,
        long: { valueIndex, keyIndex, series },
        wide: null,
        seriesByKey,
        dayFirst,
        fileIntervalMinutes,
      },
    };
  }

  const wide: ImportPlan['wide'] = [];
  const seenSeries = new Set<string>();
  for (const { column, seriesKey, unit = settings.unit } of mapping.seriesColumns) {
    const index = indexOf(column);
    if (index < 0) return missing('value', column);
    if (index === timestampIndex) return fail(`Column "${column}" cannot be both the timestamp and a value column.`);
    if (wide.some((entry) => entry.index === index)) return fail(`Column "${column}" is mapped twice; map each column to one series.`);
    const series = seriesByKey.find(seriesKey);
    if (!series) return fail(`Column "${column}" is mapped to series "${seriesKey}", which is not in the catalogue.`);
    if (seenSeries.has(series.key)) return fail(`Series "${seriesKey}" is mapped from two columns; map each series once.`);
    seenSeries.add(series.key);
    const unitProblem = checkUnit(series, unit);
    if (unitProblem) return fail(`Column "${column}": ${unitProblem.message}`);
    wide.push({ index, series, unit });
  }
  if (!wide.some((entry) => checkValues(entry.index) === null)) return checkValues(wide[0]!.index)!;
  return { ok: true, plan: { settings, columns, timestampIndex, long: null, wide, seriesByKey, dayFirst, fileIntervalMinutes } };
}
