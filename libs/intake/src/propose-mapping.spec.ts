import type { UploadLayout } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import type { CatalogueEntry } from './catalogue-entry';
import { proposeMapping, unitFromName } from './propose-mapping';

const catalogue: CatalogueEntry[] = [
  { id: 1, key: 'fdr-a', kind: 'load', unit: 'kW', intervalMinutes: 15, timeZone: 'America/Denver', timestampsMark: 'end' },
  { id: 2, key: 'wx-a', kind: 'temperature', unit: 'degF', intervalMinutes: 60, timeZone: 'America/Denver', timestampsMark: 'start' },
];
const layout = (columns: string[], offset: boolean | null = false): UploadLayout => ({
  encoding: 'utf-8',
  delimiter: ',',
  hasHeader: true,
  columns,
  decimalSeparator: '.',
  timestampsHaveOffset: offset,
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
      repeatedHourPolicy: 'reject',
      decimalSeparator: '.',
      estimateShortGaps: true,
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

describe('unitFromName', () => {
  it('reads units from common header spellings', () => {
    expect(['Load (kW)', 'load_mw', 'kWh', 'Temp °F', 'temp_c', 'Watts', 'value'].map(unitFromName)).toEqual([
      'kW',
      'MW',
      'kWh',
      'degF',
      'degC',
      'W',
      null,
    ]);
  });
});
