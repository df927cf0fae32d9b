import {
  type CreateSeriesRequest,
  type SeriesKind,
  type SeriesLevel,
  type SeriesSummary,
  type SeriesUnit,
  type TimestampsMark,
  type UpdateSeriesRequest,
  createSeriesRequestSchema,
} from '@loadwright/contracts';

/** The series form's values as its controls hold them ('' for "none" in the pickers). */
export interface SeriesFormValue {
  key: string;
  name: string;
  kind: SeriesKind;
  level: SeriesLevel | '';
  parentId: number | null;
  unit: SeriesUnit;
  intervalMinutes: number;
  timeZone: string;
  timestampsMark: TimestampsMark;
  temperatureSeriesId: number | null;
  peerGroup: string;
  description: string;
}

/** A blank form for a new series: an hourly feeder in kW, in the organisation's time zone. */
export function newSeriesForm(timeZone: string): SeriesFormValue {
  return {
    key: '',
    name: '',
    kind: 'load',
    level: 'feeder',
    parentId: null,
    unit: 'kW',
    intervalMinutes: 60,
    timeZone,
    timestampsMark: 'start',
    temperatureSeriesId: null,
    peerGroup: '',
    description: '',
  };
}

/** The form filled from a catalogue row, to edit it. */
export function seriesToForm(series: SeriesSummary): SeriesFormValue {
  return {
    key: series.key,
    name: series.name,
    kind: series.kind,
    level: series.level ?? '',
    parentId: series.parentId,
    unit: series.unit,
    intervalMinutes: series.intervalMinutes,
    timeZone: series.timeZone,
    timestampsMark: series.timestampsMark,
    temperatureSeriesId: series.temperatureSeriesId,
    peerGroup: series.peerGroup ?? '',
    description: series.description ?? '',
  };
}

/** The request body of a form: a temperature series drops level, parent and station; blank texts become null. */
export function formToRequest(value: SeriesFormValue): CreateSeriesRequest {
  const temperature = value.kind === 'temperature';
  return {
    key: value.key.trim(),
    name: value.name.trim(),
    kind: value.kind,
    level: temperature ? null : value.level || null,
    parentId: temperature ? null : value.parentId,
    unit: value.unit,
    intervalMinutes: value.intervalMinutes as CreateSeriesRequest['intervalMinutes'],
    timeZone: value.timeZone.trim(),
    timestampsMark: value.timestampsMark,
    temperatureSeriesId: temperature ? null : value.temperatureSeriesId,
    peerGroup: value.peerGroup.trim() || null,
    description: value.description.trim() || null,
  };
}

/** Only the fields an edit changed, for PATCH (the server checks the merged series against every rule). */
export function changedFields(before: SeriesSummary, value: SeriesFormValue): UpdateSeriesRequest {
  const next = formToRequest(value);
  const was = formToRequest(seriesToForm(before));
  const change: Record<string, unknown> = {};
  for (const field of Object.keys(next) as (keyof CreateSeriesRequest)[]) {
    if (field !== 'kind' && next[field] !== was[field]) change[field] = next[field];
  }
  return change as UpdateSeriesRequest;
}

/**
 * The same checks the API runs (the shared zod schema), as one message per form field; the first
 * issue of a field wins. Fields named by no control ("" for the whole form) come under "".
 */
export function formIssues(value: SeriesFormValue): Record<string, string> {
  const parsed = createSeriesRequestSchema.safeParse(formToRequest(value));
  if (parsed.success) return {};
  const issues: Record<string, string> = {};
  for (const issue of parsed.error.issues) {
    const field = String(issue.path[0] ?? '');
    issues[field] ??= issue.message;
  }
  return issues;
}
