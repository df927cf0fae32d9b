/**
 * A first proposal of how a file maps onto the catalogue, from its column names and first rows:
 * a wide file when column names are series keys; a long file otherwise, with a series key column
 * when one column's values are series keys. Units come from the column names (kW, MWh, °F…) or the
 * series; time zone and interval convention from the series. Daylight-saving repeats are never
 * guessed: the proposal says `reject` until the steward chooses. Pure.
 */
import type { UploadLayout, UploadMapping, UploadPreview, UploadProposal, UploadUnit } from '@loadwright/contracts';
import type { CatalogueEntry } from './catalogue-entry';
import { parseValueCell } from './csv/parse-number';
import { parseTimestamp } from './csv/parse-timestamp';

const timeLike = /time|date|stamp|interval|period|hour|^ts$|^when$/i;
const valueLike = /value|reading|load|demand|kwh|mwh|kw|mw|temp|power|energy/i;

/** Proposes a mapping and settings for a previewed file. */
export function proposeMapping(
  layout: UploadLayout,
  preview: UploadPreview,
  catalogue: readonly CatalogueEntry[],
  fallbackTimeZone = 'UTC',
): UploadProposal {
  const notes: string[] = [];
  const byKey = new Map(catalogue.map((entry) => [entry.key.toLowerCase(), entry]));
  const column = (i: number) => preview.rows.map((row) => row[i] ?? '');
  const parsesAsTime = (i: number) =>
    column(i)
      .filter((cell) => cell.trim() !== '')
      .every((cell) => parseTimestamp(cell) !== null);
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
    const wide = columns
      .map((name, i) => ({ name, i, entry: byKey.get(name.trim().toLowerCase()) }))
      .filter((c) => c.entry && c.i !== timestampIndex);
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
      const unmatched = columns.filter((name, i) => i !== timestampIndex && !byKey.has(name.trim().toLowerCase()));
      if (unmatched.length > 0) notes.push(`Columns not matched to a series and left out: ${unmatched.join(', ')}.`);
    } else {
      const keyIndex = columns.findIndex(
        (_, i) =>
          i !== timestampIndex &&
          column(i).length > 0 &&
          column(i).filter((cell) => byKey.has(cell.trim().toLowerCase())).length * 2 >= column(i).length,
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
                .map((cell) => byKey.get(cell.trim().toLowerCase()))
                .filter((entry) => entry !== undefined),
            ),
          ];
      }
    }
  }

  const unitColumn = mapping?.layout === 'long' ? mapping.valueColumn : mapping?.layout === 'wide' ? mapping.seriesColumns[0]!.column : '';
  const unit = unitFromName(unitColumn) ?? (mapped[0]?.unit as UploadUnit | undefined) ?? 'kW';
  const first = mapped[0];
  if (layout.timestampsHaveOffset === false) notes.push('Timestamps carry no UTC offset: check the time zone they are read in.');
  return {
    mapping,
    settings: {
      unit,
      timeZone: first?.timeZone ?? fallbackTimeZone,
      timestampsMark: first?.timestampsMark ?? 'start',
      repeatedHourPolicy: 'reject',
      decimalSeparator: layout.decimalSeparator,
      estimateShortGaps: true,
    },
    notes,
  };
}

/** The unit a column name states, e.g. "Load (kW)", "energy_kwh", "Temp °F". */
export function unitFromName(name: string): UploadUnit | null {
  const lower = name.toLowerCase();
  if (/\bkwh\b|_kwh\b/.test(lower)) return 'kWh';
  if (/\bmwh\b|_mwh\b/.test(lower)) return 'MWh';
  if (/\bmw\b|_mw\b/.test(lower)) return 'MW';
  if (/\bkw\b|_kw\b/.test(lower)) return 'kW';
  if (/°f|\bdegf\b|fahrenheit|_f\b/.test(lower)) return 'degF';
  if (/°c|\bdegc\b|celsius|_c\b/.test(lower)) return 'degC';
  if (/\bw\b|_w\b|watts?\b/.test(lower)) return 'W';
  return null;
}
