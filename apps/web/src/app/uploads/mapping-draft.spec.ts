import type { SeriesSummary, UploadLayout, UploadProposal } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { draftFromProposal, draftIssues, draftToRequest, namedSeries, withSeries } from './mapping-draft';

const layout: UploadLayout = {
  encoding: 'utf-8',
  delimiter: ',',
  hasHeader: true,
  columns: ['timestamp', 'feeder', 'load_kw'],
  decimalSeparator: '.',
  timestampsHaveOffset: true,
};
const settings = {
  unit: 'kW',
  timeZone: 'America/Chicago',
  timestampsMark: 'start',
  repeatedHourPolicy: 'reject',
  decimalSeparator: '.',
  estimateShortGaps: true,
} as const;
const longProposal: UploadProposal = {
  mapping: { layout: 'long', timestampColumn: 'timestamp', valueColumn: 'load_kw', seriesKeyColumn: 'feeder', seriesKey: null },
  settings,
  notes: [],
};

describe('a long file', () => {
  it('goes back to the request the proposal made, unchanged', () => {
    const draft = draftFromProposal(longProposal, layout);
    expect(draftToRequest(draft)).toEqual({ mapping: longProposal.mapping, settings });
    expect(draftIssues(draft)).toEqual([]);
  });

  it('asks for the series when neither a key column nor a series is chosen', () => {
    const draft = { ...draftFromProposal(longProposal, layout), seriesKeyColumn: '' };
    expect(draftIssues(draft)).toEqual(['Series: choose the column of series keys, or the one series the whole file belongs to']);
  });

  it('refuses one column used twice, and a blank value column', () => {
    const draft = { ...draftFromProposal(longProposal, layout), valueColumn: 'timestamp' };
    expect(draftIssues(draft)).toContain('Columns: the timestamp, value and series key columns must be three different columns');
    expect(draftIssues({ ...draft, valueColumn: '' })).toContain('Value column: Choose a column');
  });

  it('takes time zone, convention and unit from the one series chosen', () => {
    const draft = { ...draftFromProposal(longProposal, layout), seriesKeyColumn: '' };
    const zone = { key: 'zone-north', unit: 'MW', timeZone: 'America/Denver', timestampsMark: 'end' } as SeriesSummary;
    const chosen = withSeries(draft, zone);
    expect(draftToRequest(chosen).mapping).toEqual({
      layout: 'long',
      timestampColumn: 'timestamp',
      valueColumn: 'load_kw',
      seriesKeyColumn: null,
      seriesKey: 'zone-north',
    });
    expect(chosen.settings).toMatchObject({ unit: 'MW', timeZone: 'America/Denver', timestampsMark: 'end' });
    expect(namedSeries(chosen)).toEqual(['zone-north']);
  });
});

describe('a wide file', () => {
  const wide: UploadProposal = {
    mapping: {
      layout: 'wide',
      timestampColumn: 'time',
      seriesColumns: [
        { column: 'fdr-n1', seriesKey: 'fdr-n1' },
        { column: 'fdr-n2', seriesKey: 'fdr-n2' },
      ],
    },
    settings,
    notes: [],
  };
  const wideLayout = { ...layout, columns: ['time', 'fdr-n1', 'fdr-n2', 'spare'] };

  it('keeps the matched columns and leaves out those mapped to nothing', () => {
    const draft = draftFromProposal(wide, wideLayout);
    expect(draftToRequest({ ...draft, wideColumns: { ...draft.wideColumns, 'fdr-n2': '', spare: '' } }).mapping).toEqual({
      layout: 'wide',
      timestampColumn: 'time',
      seriesColumns: [{ column: 'fdr-n1', seriesKey: 'fdr-n1' }],
    });
  });

  it('needs at least one column mapped', () => {
    const draft = { ...draftFromProposal(wide, wideLayout), wideColumns: {} };
    expect(draftIssues(draft)).toEqual(['Columns: Map at least one column to a series']);
  });
});
