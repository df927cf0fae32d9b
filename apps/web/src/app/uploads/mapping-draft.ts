import {
  type ConfirmUploadRequest,
  type SeriesSummary,
  type UploadLayout,
  type UploadProposal,
  type UploadSettings,
  confirmUploadRequestSchema,
} from '@loadwright/contracts';

/** The mapping form as the steward edits it: both layouts' choices kept, so switching back loses nothing. */
export interface MappingDraft {
  readonly layout: 'long' | 'wide';
  readonly timestampColumn: string;
  /** Long files: the value column. */
  readonly valueColumn: string;
  /** Long files: the column of series keys, or '' when the whole file is one series. */
  readonly seriesKeyColumn: string;
  /** Long files without a key column: the series the file belongs to. */
  readonly seriesKey: string;
  /** Wide files: the series each column is read into ('' leaves a column out). */
  readonly wideColumns: Readonly<Record<string, string>>;
  readonly settings: UploadSettings;
}

/** The form as the proposal fills it; what the proposal left open stays blank for the steward. */
export function draftFromProposal(proposal: UploadProposal, layout: UploadLayout): MappingDraft {
  const mapping = proposal.mapping;
  const wideColumns: Record<string, string> = {};
  if (mapping?.layout === 'wide') for (const { column, seriesKey } of mapping.seriesColumns) wideColumns[column] = seriesKey;
  return {
    layout: mapping?.layout ?? 'long',
    timestampColumn: mapping?.timestampColumn ?? '',
    valueColumn: mapping?.layout === 'long' ? mapping.valueColumn : '',
    seriesKeyColumn: mapping?.layout === 'long' ? (mapping.seriesKeyColumn ?? '') : '',
    seriesKey: mapping?.layout === 'long' ? (mapping.seriesKey ?? '') : '',
    wideColumns,
    settings: { ...proposal.settings, decimalSeparator: proposal.settings.decimalSeparator ?? layout.decimalSeparator },
  };
}

/** The request body the draft stands for. */
export function draftToRequest(draft: MappingDraft): ConfirmUploadRequest {
  const mapping: ConfirmUploadRequest['mapping'] =
    draft.layout === 'long'
      ? {
          layout: 'long',
          timestampColumn: draft.timestampColumn,
          valueColumn: draft.valueColumn,
          seriesKeyColumn: draft.seriesKeyColumn || null,
          seriesKey: draft.seriesKeyColumn ? null : draft.seriesKey || null,
        }
      : {
          layout: 'wide',
          timestampColumn: draft.timestampColumn,
          seriesColumns: Object.entries(draft.wideColumns)
            .filter(([column, key]) => key && column !== draft.timestampColumn)
            .map(([column, seriesKey]) => ({ column, seriesKey })),
        };
  return { mapping, settings: draft.settings };
}

/**
 * What still stops the draft from being confirmed, as sentences: the shared schema's checks plus the
 * rules that tie choices together (one column cannot be two things; a long file needs its series).
 */
export function draftIssues(draft: MappingDraft): string[] {
  const issues: string[] = [];
  const request = draftToRequest(draft);
  const parsed = confirmUploadRequestSchema.safeParse(request);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) issues.push(`${fieldName(issue.path.map(String))}: ${issue.message}`);
  }
  if (draft.layout === 'long') {
    if (!draft.seriesKeyColumn && !draft.seriesKey)
      issues.push('Series: choose the column of series keys, or the one series the whole file belongs to');
    const used = [draft.timestampColumn, draft.valueColumn, draft.seriesKeyColumn].filter(Boolean);
    if (new Set(used).size !== used.length)
      issues.push('Columns: the timestamp, value and series key columns must be three different columns');
  }
  return [...new Set(issues)];
}

/** The series a confirmed draft names (empty when a key column names them row by row). */
export function namedSeries(draft: MappingDraft): string[] {
  if (draft.layout === 'wide') return [...new Set(Object.values(draft.wideColumns).filter(Boolean))];
  return !draft.seriesKeyColumn && draft.seriesKey ? [draft.seriesKey] : [];
}

/**
 * The draft after choosing the one series of a long file: time zone, timestamp convention and (for a
 * demand unit) the unit follow that series, as the proposal would have set them.
 */
export function withSeries(draft: MappingDraft, series: SeriesSummary | undefined): MappingDraft {
  if (!series) return draft;
  return {
    ...draft,
    seriesKey: series.key,
    settings: {
      ...draft.settings,
      timeZone: series.timeZone,
      timestampsMark: series.timestampsMark,
      unit: ['Wh', 'kWh', 'MWh'].includes(draft.settings.unit) ? draft.settings.unit : series.unit,
    },
  };
}

/** Readable name of a schema path, e.g. ['mapping','valueColumn'] → "Value column". */
function fieldName(path: string[]): string {
  const last = path.filter((part) => !/^\d+$/.test(part)).at(-1) ?? 'Mapping';
  const names: Record<string, string> = {
    timestampColumn: 'Timestamp column',
    valueColumn: 'Value column',
    seriesKeyColumn: 'Series key column',
    seriesKey: 'Series',
    seriesColumns: 'Columns',
    column: 'Column',
    unit: 'Unit',
    timeZone: 'Time zone',
    timestampsMark: 'Timestamps mark',
    repeatedHourPolicy: 'Repeated hour',
  };
  return names[last] ?? last;
}
