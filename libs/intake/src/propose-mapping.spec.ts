import type { UploadLayout } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import type { CatalogueEntry } from './catalogue-entry';
import { proposeMapping, unitFromName } from './propose-mapping';

const catalogue: CatalogueEntry[] = [
  { id: 1, key: 'fdr-a', kind: 'load', unit: 'kW', intervalMinutes: 15, timeZone: 'America/Denver', timestampsMark: 'end' },
  { id: 2, key: 'wx-a', kind: 'temperature', unit: 'degF', intervalMinutes: 60, timeZone: 'America/Denver', timestampsMark: 'start' },
];
const layout = (columns: string[], offset: boolean | null = false, more: Partial<UploadLayout> = {}): UploadLayout => ({
  encoding: 'utf-8',
  delimiter: ',',
  hasHeader: true,
  columns,
  decimalSeparator: '.',
  timestampsHaveOffset: offset,
  ...more,
});

describe('proposeMapping', () => {
  it('proposes a long file with its key column, the unit named in the header and the series settings', () => {
    const result = proposeMapping(
      layout(['meter', 'read at', 'energy (kWh)']),
      {
        columns: [],
        rows: [
          ['fdr-a', '2026-01-01 00:15', '12.5'],
          ['fdr-a', '2026-01-01 00:30', '12.1'],
        ],
      },
      catalogue,
    );
    expect(result.mapping).toEqual({
      layout: 'long',
      timestampColumn: 'read at',
      valueColumn: 'energy (kWh)',
      seriesKeyColumn: 'meter',
      seriesKey: null,
    });
    expect(result.settings).toEqual({
      unit: 'kWh',
      timeZone: 'America/Denver',
      timestampsMark: 'end',
      repeatedHourPolicy: 'by-order',
      decimalSeparator: '.',
      estimateShortGaps: true,
      slashDateOrder: 'month-first',
      fileIntervalMinutes: null,
    });
    expect(result.notes).toEqual(['Timestamps carry no UTC offset: check the time zone they are read in.']);
  });

  it('proposes a wide file when column names are series keys', () => {
    const result = proposeMapping(
      layout(['time', 'FDR-A', 'wx-a', 'comment'], true),
      { columns: [], rows: [['2026-01-01T00:00:00Z', '5', '31.2', 'ok']] },
      catalogue,
    );
    expect(result.mapping).toEqual({
      layout: 'wide',
      timestampColumn: 'time',
      seriesColumns: [
        { column: 'FDR-A', seriesKey: 'fdr-a', unit: 'kW' },
        { column: 'wx-a', seriesKey: 'wx-a', unit: 'degF' },
      ],
    });
    expect(result.notes).toEqual(['Columns not matched to a series and left out: comment.']);
  });

  it('never guesses the series of a file without keys, and says so', () => {
    const result = proposeMapping(
      layout(['timestamp', 'kW'], true),
      { columns: [], rows: [['2026-01-01T00:00:00Z', '5']] },
      catalogue,
      'UTC',
    );
    expect(result.mapping).toEqual({
      layout: 'long',
      timestampColumn: 'timestamp',
      valueColumn: 'kW',
      seriesKeyColumn: null,
      seriesKey: null,
    });
    expect(result.notes).toEqual(['No column holds series keys from the catalogue; choose the series this file belongs to.']);
  });
});

describe('proposeMapping of what stewards bring', () => {
  const hourly: CatalogueEntry[] = [
    { id: 3, key: 'tv-f101', kind: 'load', unit: 'kW', intervalMinutes: 60, timeZone: 'America/Chicago', timestampsMark: 'start' },
  ];

  it('proposes interval ends from an hour_ending header even when the series says start', () => {
    const result = proposeMapping(layout(['hour_ending', 'TV-F101']), { columns: [], rows: [['2026-06-01 01:00', '5']] }, hourly);
    expect(result.settings.timestampsMark).toBe('end');
    expect(result.notes).toContain('Column "hour_ending" names interval ends, so its timestamps mark the end of each interval.');
  });

  it('proposes interval ends from 24:00 rows', () => {
    const result = proposeMapping(
      layout(['date', 'TV-F101'], false, { endOfDayStamps: true }),
      { columns: [], rows: [['2026-06-01 23:00', '5']] },
      hourly,
    );
    expect(result.settings.timestampsMark).toBe('end');
    expect(result.notes).toContain('The file writes midnight as 24:00, so its timestamps mark the end of each interval.');
  });

  it('proposes the file interval when the rows are finer than the series, and says how they combine', () => {
    const result = proposeMapping(
      layout(['interval_start', 'TV-F101'], false, { intervalMinutes: 15 }),
      { columns: [], rows: [['2026-06-01 00:00', '514.6']] },
      hourly,
    );
    expect(result.settings).toMatchObject({ fileIntervalMinutes: 15, timestampsMark: 'start' });
    expect(result.notes).toContain(
      'The file holds one reading every 15 minutes and series "tv-f101" one every hour: each of its intervals is stored as the mean demand of the file\'s readings in it, and an interval the file covers only in part is left out and reported.',
    );
  });

  it('reads the slashed-date order the rows decide, and says so when none does', () => {
    const decided = proposeMapping(
      layout(['Date', 'TV-F101'], false, { slashDateOrder: 'day-first' }),
      { columns: [], rows: [['13/3/2026 00:00', '5']] },
      hourly,
    );
    expect(decided.mapping?.timestampColumn).toBe('Date');
    expect(decided.settings.slashDateOrder).toBe('day-first');
    const open = proposeMapping(layout(['Date', 'TV-F101']), { columns: [], rows: [['3/9/2026 12:00 AM', '5']] }, hourly);
    expect(open.settings.slashDateOrder).toBe('month-first');
    expect(open.notes).toContain(
      'No row shows whether dates such as 3/9/2026 put the month or the day first: they are read month first; check.',
    );
  });
});

describe('unitFromName', () => {
  it('reads units from common header spellings', () => {
    expect(['Load (kW)', 'load_mw', 'kWh', 'Temp °F', 'temp_c', 'Watts', 'value', 'energy_wh'].map(unitFromName)).toEqual([
      'kW',
      'MW',
      'kWh',
      'degF',
      'degC',
      'W',
      null,
      'Wh',
    ]);
  });
});
