/**
 * File uploads of interval readings: what a steward sends, what Loadwright detects and proposes,
 * the mapping and settings the steward confirms, the import's progress, and the validation report.
 *
 * Flow for the web app:
 *   1. POST /api/uploads (multipart/form-data, one field `file`) → `UploadReceipt`: the upload, the
 *      detected layout, a preview of the first rows and a proposed mapping. When the same bytes were
 *      uploaded before, `duplicateOf` names that upload and nothing new is stored.
 *   2. POST /api/uploads/:id/mapping with `ConfirmUploadRequest` → the upload, now `queued`; a 400
 *      problem names the column when the mapping does not fit the file.
 *   3. Poll GET /api/uploads/:id → `UploadDetail` (status, `progress` 0–100, counts, report) until
 *      `status` is `done`, `failed`, `cancelled` or `awaiting_choice`; `failed` carries one message
 *      naming the row and column. `awaiting_choice` lists in `repeatedHours` the repeated
 *      daylight-saving hours the file's order cannot place, with their readings; the steward answers
 *      with POST /api/uploads/:id/repeated-hours (`RepeatedHourChoicesRequest`) and the import resumes.
 *   4. GET /api/uploads/:id/report.csv downloads every finding (spreadsheet-safe).
 *   DELETE /api/uploads/:id discards an upload still awaiting its mapping (204); POST
 *   /api/uploads/:id/cancel stops one that is queued, importing or awaiting a choice (`cancelled`).
 */
import { z } from 'zod';
import { digitsSchema, int4Max } from './input';
import { timeZoneSchema, timestampsMarks } from './series';

/**
 * Where an upload stands: `received` (stored and previewed, awaiting its mapping), `queued` (mapping
 * confirmed, import job waiting), `importing`, `done` (every usable row landed), `failed` (nothing
 * landed; `error` says why, naming the row and column), `cancelled` (a steward stopped it; nothing
 * landed; `error` says who), `awaiting_choice` (the import stopped before storing anything to ask how
 * to read repeated daylight-saving hours its file's order cannot place).
 */
export const uploadStatuses = ['received', 'queued', 'importing', 'done', 'failed', 'cancelled', 'awaiting_choice'] as const;
export type UploadStatus = (typeof uploadStatuses)[number];

/**
 * Units a file's values may be in. Demand: W, kW, MW. Energy per interval: Wh, kWh, MWh, converted to
 * the mean demand over the file's own interval (kWh per 15 minutes × 4 = kW). Temperature: degC, degF.
 */
export const uploadUnits = ['W', 'kW', 'MW', 'Wh', 'kWh', 'MWh', 'degC', 'degF'] as const;
export type UploadUnit = (typeof uploadUnits)[number];

/**
 * What to do with a local time that occurs twice (the repeated hour when clocks fall back):
 * `by-order` (proposed) places the two readings of a repeated time by their order in the file when the
 * series' rows are in time order (the first is daylight time, the second standard time); when order
 * cannot decide (a single reading at a repeated time, or rows out of order) the import stops before
 * storing anything and asks the steward (status `awaiting_choice`); `first-is-daylight` takes the first occurrence as daylight time and any later one as
 * standard time whatever the order; `reject` drops every reading at a repeated time.
 */
export const repeatedHourPolicies = ['by-order', 'first-is-daylight', 'reject'] as const;

/**
 * The steward's answer for one repeated hour the file's order cannot place: the reading first in the
 * file is daylight time (and a second one standard time), the second is daylight time (the first is
 * standard time; a lone reading is standard time), or drop the hour's readings.
 */
export const repeatedHourChoiceKinds = ['first-is-daylight', 'second-is-daylight', 'drop'] as const;
export type RepeatedHourChoiceKind = (typeof repeatedHourChoiceKinds)[number];

/** A repeated local time of one series, as findings and questions write it: 2026-11-01 01:00. */
const localWallClockSchema = z.string().regex(/^\d{4}-\d{2}-\d{2} \d{2}:\d{2}$/, 'Give the local time as YYYY-MM-DD HH:MM');

/** One answered repeated hour. */
export const repeatedHourChoiceSchema = z.object({
  seriesKey: z.string().min(1).max(200),
  local: localWallClockSchema,
  choice: z.enum(repeatedHourChoiceKinds),
});
export type RepeatedHourChoice = z.infer<typeof repeatedHourChoiceSchema>;

/** Most repeated hours one upload may ask about (a file with more should be sorted or carry UTC offsets). */
export const maxRepeatedHourQuestions = 500;

/** A repeated hour the import could not place by order, with the readings the file holds at that time. */
export const repeatedHourQuestionSchema = z.object({
  seriesKey: z.string(),
  /** Local wall-clock time that occurs twice, and its zone. */
  local: z.string(),
  timeZone: z.string(),
  /** Why order cannot decide: the series' rows are not in time order, or the file holds one reading at that time. */
  reason: z.enum(['rows-out-of-order', 'single-reading']),
  /** Interval starts (UTC) of the reading as daylight time and as standard time. */
  daylightStart: z.iso.datetime(),
  standardStart: z.iso.datetime(),
  /** The readings at that time in file order (values in the series' unit). */
  readings: z.array(z.object({ sourceRow: z.number().int(), value: z.number() })),
  unit: z.string(),
});
export type RepeatedHourQuestion = z.infer<typeof repeatedHourQuestionSchema>;

/** POST /api/uploads/:id/repeated-hours: one choice for every repeated hour the upload asks about. */
export const repeatedHourChoicesRequestSchema = z.object({
  choices: z.array(repeatedHourChoiceSchema).min(1, 'Choose for each repeated hour').max(maxRepeatedHourQuestions),
});
export type RepeatedHourChoicesRequest = z.infer<typeof repeatedHourChoicesRequestSchema>;

/** How to read a slashed date such as 3/9/2026: month first (US) or day first. */
export const slashDateOrders = ['month-first', 'day-first'] as const;
export type SlashDateOrder = (typeof slashDateOrders)[number];
export type RepeatedHourPolicy = (typeof repeatedHourPolicies)[number];

/** The validation rules whose findings an import records. */
export const validationRules = [
  'gap',
  'spike',
  'flat_line',
  'negative',
  'impossible',
  'duplicate_equal',
  'duplicate_conflict',
  'off_grid',
  'future',
  'dst_repeated_hour',
  'dst_missing_hour',
  'unparseable',
  'unknown_series',
  'estimated',
  'dst_resolved',
  'partial_interval',
  'mixed_interval',
] as const;
export type ValidationRule = (typeof validationRules)[number];

/** What each rule means, for the report's headings. */
export const validationRuleDescriptions: Record<ValidationRule, string> = {
  gap: 'Missing intervals between readings (short gaps are estimated, longer ones only reported)',
  spike:
    "Reading far from its neighbours (Hampel identifier: more than 6 robust standard deviations from the median of the 13 readings around it) and from the series' own shape (the same time on the 3 days and 2 weeks either side)",
  flat_line: 'Identical values for longer than the limit (6 hours for load, 12 for temperature)',
  negative: 'Load below zero',
  impossible:
    'Beyond what the series can physically read (load over 10× its robust maximum; temperature outside −60…60 °C); a value beyond any electric load (over 10 TW) or below absolute zero is refused with its row',
  duplicate_equal: 'The same instant twice with the same value (dropped)',
  duplicate_conflict: 'The same instant twice with different values (the first kept, the other dropped)',
  off_grid: "Timestamp off the series' interval grid (dropped)",
  future: 'Reading after the time of the import (dropped)',
  dst_repeated_hour:
    'Local time in the repeated daylight-saving hour that was not stored (the upload rejects repeated hours, or the steward chose to drop it; the detail says which)',
  dst_missing_hour: 'Local time that does not exist (skipped by the spring-forward change; dropped)',
  unparseable: 'A cell that holds no reading (a marker such as NaN or NA): no reading stored for it',
  unknown_series: 'Series key not in the catalogue (row dropped)',
  estimated: 'An estimate was stored (method in the detail)',
  dst_resolved:
    "A reading in the repeated daylight-saving hour placed by its order in the file (daylight time first, then standard time) or by the steward's choice",
  partial_interval:
    "Readings of a series interval the file covers only in part (the file's finer readings are combined only when every one is there; dropped)",
  mixed_interval:
    "Steps between a series' readings at another interval than the file's (shorter, or no whole multiple of it): the file mixes intervals, and readings off the series' grid are dropped; one finding per series, with the steps seen",
};

/**
 * Whether a rule's finding asks the steward to act (`defect`) or only says what the import did
 * (`information`: an estimate stored, a repeated hour placed by order).
 */
export const validationRuleSeverity: Record<ValidationRule, 'defect' | 'information'> = {
  gap: 'defect',
  spike: 'defect',
  flat_line: 'defect',
  negative: 'defect',
  impossible: 'defect',
  duplicate_equal: 'defect',
  duplicate_conflict: 'defect',
  off_grid: 'defect',
  future: 'defect',
  dst_repeated_hour: 'defect',
  dst_missing_hour: 'defect',
  unparseable: 'defect',
  unknown_series: 'defect',
  estimated: 'information',
  dst_resolved: 'information',
  partial_interval: 'defect',
  mixed_interval: 'defect',
};

/** Field separators Loadwright detects. */
export const csvDelimiters = [',', ';', '\t'] as const;

/** Text encodings Loadwright reads (UTF-16 needs its byte-order mark). */
export const csvEncodings = ['utf-8', 'utf-16le', 'utf-16be'] as const;

/** What Loadwright detected about a file. */
export const uploadLayoutSchema = z.object({
  encoding: z.enum(csvEncodings),
  delimiter: z.enum(csvDelimiters),
  /** False when the first row already holds data; columns are then named "column 1", "column 2", … */
  hasHeader: z.boolean(),
  /** Column names in file order. */
  columns: z.array(z.string()),
  /** Decimal separator seen in the values ("," only in semicolon files such as 12,5). */
  decimalSeparator: z.enum(['.', ',']),
  /** Whether the timestamps carry a UTC offset (ISO 8601 with Z or ±hh:mm) or are local times. */
  timestampsHaveOffset: z.boolean().nullable(),
  /**
   * How the first rows' slashed dates read: `month-first` when a second field exceeds 12 (3/13/2026),
   * `day-first` when a first field does (13/3/2026), null when no row decides or there are none.
   */
  slashDateOrder: z.enum(slashDateOrders).nullable().optional(),
  /** Whether the first rows write midnight as 24:00 of the day before, as files stamped at interval ends do. */
  endOfDayStamps: z.boolean().optional(),
  /** Minutes between consecutive timestamps (the most common step in windows spread through the file); null when undecided. */
  intervalMinutes: z.number().int().positive().nullable().optional(),
  /**
   * Other intervals the file's steps show beside `intervalMinutes` (shorter steps, or steps that are no
   * whole multiple of it), with their share of the sampled steps; empty unless they make up 5 % or more.
   */
  mixedIntervals: z.array(z.object({ minutes: z.number().int().positive(), share: z.number().min(0).max(1) })).optional(),
});
export type UploadLayout = z.infer<typeof uploadLayoutSchema>;

/** The first rows of a file as text, for the mapping screen. */
export const uploadPreviewSchema = z.object({
  columns: z.array(z.string()),
  /** Up to 20 data rows, cells as written in the file. */
  rows: z.array(z.array(z.string())),
});
export type UploadPreview = z.infer<typeof uploadPreviewSchema>;

const columnName = z.string().min(1, 'Choose a column');

/** A long file: one row per reading, with a timestamp, a value and (for many series) a series key column. */
export const longMappingSchema = z.object({
  layout: z.literal('long'),
  timestampColumn: columnName,
  valueColumn: columnName,
  /** Column holding series keys; null when the whole file is one series (then `seriesKey`). */
  seriesKeyColumn: z.string().min(1).nullable(),
  /** The series of a file without a key column; null when `seriesKeyColumn` is set. */
  seriesKey: z.string().min(1).nullable(),
});

/** A wide file: a timestamp column and one value column per series. */
export const wideMappingSchema = z.object({
  layout: z.literal('wide'),
  timestampColumn: columnName,
  seriesColumns: z
    .array(
      z.object({
        column: columnName,
        seriesKey: z.string().min(1, 'Choose a series'),
        /** This column's unit when it differs from the upload's (e.g. a °F column beside kW ones). */
        unit: z.enum(uploadUnits).optional(),
      }),
    )
    .min(1, 'Map at least one column to a series'),
});

/** How the file's columns map onto series and readings. */
export const uploadMappingSchema = z.discriminatedUnion('layout', [longMappingSchema, wideMappingSchema]);
export type UploadMapping = z.infer<typeof uploadMappingSchema>;

/** How to read the values and timestamps. */
export const uploadSettingsSchema = z.object({
  unit: z.enum(uploadUnits),
  /** IANA zone in which timestamps without an offset are read. */
  timeZone: timeZoneSchema,
  /** Whether a timestamp marks the start or the end of its interval (stored readings keep starts). */
  timestampsMark: z.enum(timestampsMarks),
  repeatedHourPolicy: z.enum(repeatedHourPolicies),
  decimalSeparator: z.enum(['.', ',']).default('.'),
  /** Fill gaps of up to 3 intervals with linear estimates (flagged); default true. */
  estimateShortGaps: z.boolean().default(true),
  /** How slashed dates such as 3/9/2026 read; month first when absent. */
  slashDateOrder: z.enum(slashDateOrders).optional(),
  /**
   * Minutes between the file's readings, when they differ from the series' interval: energy per
   * interval converts by this interval, and finer readings combine into the series' interval as
   * their mean. Null or absent: the step seen in the file's first rows, else the series' interval.
   */
  fileIntervalMinutes: z.number().int().min(1).max(1440).nullable().optional(),
  /** The steward's answers for repeated hours the file's order cannot place (policy `by-order`). */
  repeatedHourChoices: z.array(repeatedHourChoiceSchema).max(maxRepeatedHourQuestions).optional(),
});
export type UploadSettings = z.infer<typeof uploadSettingsSchema>;

/** POST /api/uploads/:id/mapping */
export const confirmUploadRequestSchema = z.object({ mapping: uploadMappingSchema, settings: uploadSettingsSchema });
export type ConfirmUploadRequest = z.infer<typeof confirmUploadRequestSchema>;

/** A proposed mapping: complete where the file made it clear; `notes` say what the steward must still choose. */
export const uploadProposalSchema = z.object({
  mapping: uploadMappingSchema.nullable(),
  settings: uploadSettingsSchema,
  notes: z.array(z.string()),
});
export type UploadProposal = z.infer<typeof uploadProposalSchema>;

/** One upload as lists show it. */
export const uploadSchema = z.object({
  id: z.number().int(),
  fileName: z.string(),
  byteSize: z.number().int(),
  source: z.enum(['csv', 'api', 'green_button']),
  status: z.enum(uploadStatuses),
  /** Percent done, 0–100, from rows processed. */
  progress: z.number().min(0).max(100),
  /** Who uploaded it (person's name or token name); null when unknown. */
  uploadedBy: z.string().nullable(),
  createdAt: z.iso.datetime(),
  startedAt: z.iso.datetime().nullable(),
  finishedAt: z.iso.datetime().nullable(),
  /** Data rows in the file, once read. */
  rowsTotal: z.number().int().nullable(),
  rowsProcessed: z.number().int(),
  /** Readings stored at new instants (estimate-only rows for short gaps included). */
  rowsImported: z.number().int(),
  /** Readings not stored (duplicates, off-grid, future, unknown series, daylight-saving rejections). */
  rowsRejected: z.number().int(),
  /** Readings equal to those already stored. */
  rowsUnchanged: z.number().int(),
  /** Readings that corrected a stored value (the old one kept as revision). */
  rowsRevised: z.number().int(),
  /** Why the upload failed, naming row and column; null unless `failed`. */
  error: z.string().nullable(),
  mapping: uploadMappingSchema.nullable(),
  settings: uploadSettingsSchema.nullable(),
});
export type Upload = z.infer<typeof uploadSchema>;

/** One finding as the report shows it. */
export const uploadFindingSchema = z.object({
  rule: z.enum(validationRules),
  seriesKey: z.string().nullable(),
  /** The reading's instant (interval start, UTC). */
  ts: z.iso.datetime().nullable(),
  value: z.number().nullable(),
  /** Row in the file (the header is row 1). */
  sourceRow: z.number().int().nullable(),
  /** Rule-specific facts (limit, method of an estimate, gap length…). */
  detail: z.record(z.string(), z.unknown()),
});
export type UploadFinding = z.infer<typeof uploadFindingSchema>;

/** The validation report: counts per rule and up to 10 examples of each. */
export const uploadReportSchema = z.object({
  counts: z.array(
    z.object({
      rule: z.enum(validationRules),
      count: z.number().int(),
      description: z.string(),
      /** `information` findings say what the import did; `defect` ones ask the steward to act. */
      severity: z.enum(['defect', 'information']),
    }),
  ),
  examples: z.array(uploadFindingSchema),
});
export type UploadReport = z.infer<typeof uploadReportSchema>;

/** GET /api/uploads/:id */
export const uploadDetailSchema = z.object({
  upload: uploadSchema,
  report: uploadReportSchema,
  /** While `received`: what was detected, the first rows and the proposal, to build the mapping form. */
  layout: uploadLayoutSchema.nullable(),
  preview: uploadPreviewSchema.nullable(),
  proposal: uploadProposalSchema.nullable(),
  /** While `awaiting_choice`: the repeated hours to choose for; empty otherwise. */
  repeatedHours: z.array(repeatedHourQuestionSchema),
});
export type UploadDetail = z.infer<typeof uploadDetailSchema>;

/** POST /api/uploads (201, or 200 with `duplicateOf` when the same bytes were uploaded before). */
export const uploadReceiptSchema = uploadDetailSchema.extend({
  /** The earlier upload of the same bytes; when set, `upload` is that one and nothing was added. */
  duplicateOf: z.number().int().nullable(),
  /** A sentence for the steward, e.g. "Already imported as upload 12." */
  message: z.string().nullable(),
});
export type UploadReceipt = z.infer<typeof uploadReceiptSchema>;

/** GET /api/uploads */
export const uploadListQuerySchema = z.object({
  status: z.enum(uploadStatuses).optional(),
  limit: digitsSchema(1, 200).default(50),
  offset: digitsSchema(0, int4Max).default(0),
});
export type UploadListQuery = z.infer<typeof uploadListQuerySchema>;

/** A page of uploads, newest first. */
export const uploadPageSchema = z.object({ items: z.array(uploadSchema), total: z.number().int() });
export type UploadPage = z.infer<typeof uploadPageSchema>;
