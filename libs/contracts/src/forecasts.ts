/**
 * Forecast review, adjustment, approval and hand-on: what the series page, the approval screens and
 * downstream systems read and send.
 *
 * Routes (under /api), with the permission each needs:
 * - GET    series/:id/forecast                      data.read          → forecastReviewSchema
 * - GET    series/:id/forecast-versions             data.read          forecastVersionsQuerySchema → forecastVersionPageSchema
 * - GET    forecast-versions/:id                    data.read          → forecastVersionDetailSchema
 * - POST   forecast-versions/:id/adjustments        forecasts.approve  createAdjustmentRequestSchema → 201 forecastAdjustmentSchema
 * - DELETE forecast-versions/:id/adjustments/:aid   forecasts.approve  → 204
 * - POST   forecast-versions/:id/approve            forecasts.approve  → approvalResultSchema
 * - POST   forecast-approvals/preview               forecasts.approve  approvalPreviewRequestSchema → approvalPreviewSchema
 * - POST   forecast-approvals                       forecasts.approve  bulkApprovalRequestSchema → approvalResultSchema
 * - GET    exports/forecasts.csv                    data.read (tokens) forecastExportQuerySchema → text/csv (build links with forecastExportPath)
 * - GET    exports/forecasts                        data.read (tokens) forecastExportQuerySchema → forecastExportSchema
 * Problems: 404 unknown series/version; 409 (`/problems/conflict`) when a version is no longer a draft
 * (adjusting or approving an approved or superseded version; a bulk approval lists every stale version
 * in `errors` with a pointer `/versionIds/<index>` and approves nothing); 400 with pointers for input.
 *
 * Conventions used throughout:
 * - Instants (`ts`, `issuedAt`, …) are UTC ISO 8601 strings. A forecast point's `ts` is the START of
 *   its interval; the interval is `[ts, ts + intervalMinutes)` and its value is the mean demand over
 *   that interval in the series' unit.
 * - Local dates and times (daily peaks) are in the series' own IANA time zone.
 * - The adjusted numbers of an interval are (definition used by the API, the exports and the web):
 *   `adjusted = model × (product of every scale covering it) + (sum of every shift covering it)`.
 *   Scales act first, whenever they were created, so a shift always moves the forecast by exactly the
 *   amount the planner typed; within each kind, adjustments apply in creation order (which for
 *   products and sums does not change the result). An adjustment covers an interval when
 *   `from <= ts < to`. Bounds move with the mean for a shift and are multiplied for a scale.
 */
import { z } from 'zod';
import { digitsSchema, idParamSchema, instantSchema, recordIdSchema } from './input';

/** Life of a forecast version: drafted by a refit, approved by a planner, then superseded. */
export const forecastStates = ['draft', 'approved', 'superseded'] as const;
export type ForecastState = (typeof forecastStates)[number];

/** How an adjustment changes the model's numbers: add an amount, or multiply by a factor. */
export const adjustmentKinds = ['shift', 'scale'] as const;
export type AdjustmentKind = (typeof adjustmentKinds)[number];

/** Interval levels (percent) whose bounds every version stores and the exports can include. */
export const forecastIntervalLevels = [80, 95] as const;
export type ForecastIntervalLevel = (typeof forecastIntervalLevels)[number];

/** True when `name` is `UTC` or an IANA time zone this runtime knows, e.g. America/Chicago. */
export function isKnownTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

/**
 * Share of a version's horizon that may lie in the past before the version counts as stale. A draft
 * issued on 2 December for 23–29 November has every hour behind it; one issued this morning for the
 * next 168 hours has none. Past half, most of what the version says is about hours already gone: its
 * numbers no longer describe the week ahead, so approving or handing it on needs a word of warning.
 */
export const staleAfterPassedShare = 0.5;

/** How much of a version's horizon is still ahead. */
export interface VersionTimeliness {
  /** Whole hours of the horizon still ahead of `now` (0 when every hour has passed). */
  hoursAhead: number;
  /** Hours of the horizon already behind `now`. */
  hoursPassed: number;
  /** True when more than `staleAfterPassedShare` of the horizon has passed. */
  stale: boolean;
}

/** How much of the version `[origin, origin + horizonHours h)` lies ahead of `now`; see staleAfterPassedShare. */
export function versionTimeliness(version: { origin: string | Date; horizonHours: number }, now: Date = new Date()): VersionTimeliness {
  const start = typeof version.origin === 'string' ? Date.parse(version.origin) : version.origin.getTime();
  const aheadMs = start + version.horizonHours * 3_600_000 - now.getTime();
  const hoursAhead = Math.max(0, Math.min(version.horizonHours, Math.floor(aheadMs / 3_600_000)));
  const hoursPassed = version.horizonHours - hoursAhead;
  return { hoursAhead, hoursPassed, stale: hoursPassed > version.horizonHours * staleAfterPassedShare };
}

/** The series a forecast belongs to, as the review and export screens need it. */
export const forecastSeriesSchema = z.object({
  id: z.number().int(),
  key: z.string(),
  name: z.string(),
  /** Place in the hierarchy (null for a temperature station). */
  level: z.enum(['system', 'zone', 'substation', 'feeder']).nullable(),
  parentId: z.number().int().nullable(),
  unit: z.string(),
  /** Length of each interval in minutes (60 for hourly). */
  intervalMinutes: z.number().int(),
  /** IANA time zone in which daily peaks and local dates are reckoned. */
  timeZone: z.string(),
});

/** The estimated model a version was forecast from: method, orders and information criteria. */
export const versionFitSchema = z.object({
  id: z.number().int(),
  /** The method that produced the fit as the database names it (never `auto`: auto records its choice). */
  method: z.string(),
  arOrder: z.number().int(),
  maOrder: z.number().int(),
  aic: z.number().nullable(),
  aicc: z.number().nullable(),
  bic: z.number().nullable(),
  /** Innovation variance. */
  sigma2: z.number().nullable(),
  logLikelihood: z.number().nullable(),
  observationCount: z.number().int(),
  /** First and last instant of the training window. */
  dataStart: z.iso.datetime(),
  dataEnd: z.iso.datetime(),
});

/** A mean with its 80 % and 95 % bounds. */
export const forecastBandSchema = z.object({
  mean: z.number(),
  lower80: z.number(),
  upper80: z.number(),
  lower95: z.number(),
  upper95: z.number(),
});

/** One forecast interval: the model's numbers, and the adjusted ones when an adjustment covers it. */
export const forecastPointSchema = forecastBandSchema.extend({
  /** Start of the interval (UTC). */
  ts: z.iso.datetime(),
  /** Standard error of the model's mean. */
  stdError: z.number(),
  /** The numbers after the planner's adjustments; null where no adjustment covers the interval. */
  adjusted: forecastBandSchema.nullable(),
});

/** The number that counts at a point: the adjusted mean where a planner adjusted it, else the model's. */
export function effectiveMean(point: Pick<ForecastPoint, 'mean' | 'adjusted'>): number {
  return point.adjusted?.mean ?? point.mean;
}

/** A planner's adjustment of a period of a draft, kept beside the model's numbers. */
export const forecastAdjustmentSchema = z.object({
  id: z.number().int(),
  versionId: z.number().int(),
  /** First instant covered (inclusive). */
  from: z.iso.datetime(),
  /** End of the period (exclusive). */
  to: z.iso.datetime(),
  kind: z.enum(adjustmentKinds),
  /** For a shift, the amount added in the series' unit; for a scale, the factor (> 0). */
  amount: z.number(),
  reason: z.string(),
  createdBy: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  createdAt: z.iso.datetime(),
  /** How many of the version's intervals it covers. */
  intervals: z.number().int(),
});

/** The highest value of one local day and when it happens. */
export const dailyPeakSchema = z.object({
  /** Local calendar date, YYYY-MM-DD, in the series' time zone. */
  date: z.string(),
  /** Start of the peak interval (UTC). */
  ts: z.iso.datetime(),
  /** Local wall-clock time of the peak interval's start, HH:mm. */
  localTime: z.string(),
  /** UTC offset in force at the peak, e.g. -05:00 (tells the two 01:00s of a fall-back day apart). */
  utcOffset: z.string(),
  /** The peak value: the adjusted mean where adjusted, else the model's (for actuals: the reading). */
  value: z.number(),
  /** Intervals of this local day that have a value. */
  intervals: z.number().int(),
  /** True when every interval of the local day has a value (23, 24 or 25 hourly intervals). */
  complete: z.boolean(),
});

/** Something the planner should know about how a version was made (e.g. temperature fallback). */
export const forecastWarningSchema = z.object({ code: z.string(), message: z.string() });

/** A version without its points: for history lists. */
export const forecastVersionSummarySchema = z.object({
  id: z.number().int(),
  seriesId: z.number().int(),
  state: z.enum(forecastStates),
  issuedAt: z.iso.datetime(),
  /** First forecast instant. */
  origin: z.iso.datetime(),
  /** End of the last forecast interval (exclusive). */
  end: z.iso.datetime(),
  horizonHours: z.number().int(),
  /** Interval levels the version was made with (percent). */
  levels: z.array(z.number().int()),
  warnings: z.array(forecastWarningSchema),
  refitRunId: z.number().int().nullable(),
  approvedAt: z.iso.datetime().nullable(),
  approvedBy: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  supersededAt: z.iso.datetime().nullable(),
  fit: versionFitSchema,
  adjustmentCount: z.number().int(),
});

/** A whole version: summary, adjustments (creation order), points and local daily peaks. */
export const forecastVersionSchema = forecastVersionSummarySchema.extend({
  adjustments: z.array(forecastAdjustmentSchema),
  points: z.array(forecastPointSchema),
  dailyPeaks: z.array(dailyPeakSchema),
});

/** GET /api/forecast-versions/:id */
export const forecastVersionDetailSchema = z.object({ series: forecastSeriesSchema, version: forecastVersionSchema });

/** One actual reading: the estimate where one replaces (or fills in for) the raw reading. */
export const actualPointSchema = z.object({
  ts: z.iso.datetime(),
  value: z.number(),
  /** True when the value is an estimate rather than the raw reading. */
  estimated: z.boolean(),
});

/** Draft minus approved at one interval both cover (adjusted means where adjusted). */
export const intervalDifferenceSchema = z.object({
  ts: z.iso.datetime(),
  draft: z.number(),
  approved: z.number(),
  /** draft − approved, in the series' unit. */
  difference: z.number(),
  /** difference / |approved| × 100; null when approved is 0. */
  differencePercent: z.number().nullable(),
});

/** Draft and approved peaks of one local day. */
export const peakDifferenceSchema = z.object({
  date: z.string(),
  draft: dailyPeakSchema.nullable(),
  approved: dailyPeakSchema.nullable(),
  /** draft peak − approved peak; null unless both have the day. */
  difference: z.number().nullable(),
  differencePercent: z.number().nullable(),
  /** How many minutes later (positive) or earlier the draft peaks; null unless both have the day. */
  peakShiftMinutes: z.number().int().nullable(),
});

/** Energy of draft and approved over the intervals both cover, in unit·hours (e.g. MWh). */
export const energyDifferenceSchema = z.object({
  intervals: z.number().int(),
  draft: z.number(),
  approved: z.number(),
  difference: z.number(),
  /** null when there is no common interval or approved energy is 0. */
  differencePercent: z.number().nullable(),
});

/** How the draft differs from the approved version. */
export const versionComparisonSchema = z.object({
  intervals: z.array(intervalDifferenceSchema),
  dailyPeaks: z.array(peakDifferenceSchema),
  energy: energyDifferenceSchema,
});

/** GET /api/series/:id/forecast: everything the review panel shows. */
export const forecastReviewSchema = z.object({
  series: forecastSeriesSchema,
  /** The current draft, if a refit has written one that is not approved yet. */
  draft: forecastVersionSchema.nullable(),
  /** The version in force (last approved). */
  approved: forecastVersionSchema.nullable(),
  /** Readings so far over the window the two versions span. */
  actuals: z.object({
    /** Window start and (exclusive) end; null when there is no version. */
    from: z.iso.datetime().nullable(),
    to: z.iso.datetime().nullable(),
    points: z.array(actualPointSchema),
    dailyPeaks: z.array(dailyPeakSchema),
  }),
  /** Draft versus approved; null unless both exist. */
  comparison: versionComparisonSchema.nullable(),
});

/** GET /api/series/:id/forecast-versions: newest first; `before` continues from the last id of a page. */
export const forecastVersionsQuerySchema = z.object({
  state: z.enum(forecastStates).optional(),
  before: idParamSchema.optional(),
  limit: digitsSchema(1, 200).default(50),
});

/** A page of version history. */
export const forecastVersionPageSchema = z.object({
  versions: z.array(forecastVersionSummarySchema),
  /** Pass as `before` for the next page; null on the last page. */
  nextBefore: z.number().int().nullable(),
});

/**
 * The largest change of an interval's forecast, as a share of the number before the adjustment, that
 * an adjustment makes without the planner confirming it. The known events planners adjust for (a
 * holiday, a planned outage, a plant trip, a big customer switching on or off) move a feeder's or a
 * zone's load by tens of percent; a change beyond half of the load is far more often a slip (kW typed
 * as MW, a factor of 11 meant as 1.1, a sign left off) than an event, so it is asked about once.
 */
export const plausibleAdjustmentShare = 0.5;

/** POST /api/forecast-versions/:id/adjustments (drafts only). */
export const createAdjustmentRequestSchema = z
  .object({
    /** First instant covered (inclusive), ISO 8601 with Z or an offset. */
    from: instantSchema({ offset: true }),
    /** End of the period (exclusive). */
    to: instantSchema({ offset: true }),
    kind: z.enum(adjustmentKinds),
    /** Shift: amount added in the series' unit (may be negative). Scale: factor, greater than 0. */
    amount: z.number().finite(),
    /** Why (an outage, a plant trip, a holiday, a big customer…). */
    reason: z.string().trim().min(5, 'Give a reason of at least 5 characters').max(500),
    /** The planner confirms a change larger than plausibleAdjustmentShare of the forecast (see there). */
    confirmLargeChange: z.boolean().default(false),
  })
  .superRefine((value, ctx) => {
    if (Date.parse(value.to) <= Date.parse(value.from))
      ctx.addIssue({ code: 'custom', path: ['to'], message: 'End the period after it starts' });
    if (value.kind === 'scale' && !(value.amount > 0))
      ctx.addIssue({ code: 'custom', path: ['amount'], message: 'A scale factor must be greater than 0 (1.1 raises by 10 %)' });
    if (value.kind === 'shift' && value.amount === 0)
      ctx.addIssue({ code: 'custom', path: ['amount'], message: 'A shift of 0 changes nothing' });
  });

/** POST /api/forecast-approvals/preview: the series to summarise, by list or by group. */
export const approvalPreviewRequestSchema = z
  .object({
    seriesIds: z.array(recordIdSchema).min(1).max(10_000).optional(),
    /** A hierarchy node: it and all its descendants. */
    parentId: recordIdSchema.optional(),
    /** Put stale drafts (most of their hours passed) among the ids to approve; left out by default. */
    includeStale: z.boolean().default(false),
  })
  .refine((value) => (value.seriesIds === undefined) !== (value.parentId === undefined), {
    message: 'Send either seriesIds or parentId',
    path: ['seriesIds'],
  });

/** A version's peak over its whole horizon. */
export const horizonPeakSchema = z.object({
  ts: z.iso.datetime(),
  /** Local date and time in the series' time zone. */
  date: z.string(),
  localTime: z.string(),
  value: z.number(),
});

/** What approving one series' draft would change. */
export const approvalPreviewItemSchema = z.object({
  series: forecastSeriesSchema,
  draft: z
    .object({
      versionId: z.number().int(),
      issuedAt: z.iso.datetime(),
      origin: z.iso.datetime(),
      adjustmentCount: z.number().int(),
      peak: horizonPeakSchema.nullable(),
      /** End of the draft's last interval (exclusive). */
      end: z.iso.datetime(),
      /** Whole hours of the draft still ahead at the preview. */
      hoursAhead: z.number().int(),
      /** More than half of the draft's hours have passed (see staleAfterPassedShare). */
      stale: z.boolean(),
    })
    .nullable(),
  approved: z
    .object({
      versionId: z.number().int(),
      approvedAt: z.iso.datetime().nullable(),
      origin: z.iso.datetime(),
      peak: horizonPeakSchema.nullable(),
    })
    .nullable(),
  /** draft peak − approved peak over each one's horizon; null unless both exist. */
  peakDifference: z.number().nullable(),
  peakDifferencePercent: z.number().nullable(),
  /** Energy over the intervals both cover; null unless both exist. */
  energy: energyDifferenceSchema.nullable(),
});

/** The preview: one item per series in scope, and the draft ids to send to POST /api/forecast-approvals. */
export const approvalPreviewSchema = z.object({
  items: z.array(approvalPreviewItemSchema),
  versionIds: z.array(z.number().int()),
  /** Series in scope without a draft (nothing to approve). */
  withoutDraft: z.number().int(),
  /** Ids of the stale drafts in scope: left out of versionIds unless the request included them. */
  staleVersionIds: z.array(z.number().int()),
});

/** POST /api/forecast-approvals: approve these drafts together, all or none. */
export const bulkApprovalRequestSchema = z.object({
  versionIds: z
    .array(recordIdSchema)
    .min(1)
    .max(10_000)
    .refine((ids) => new Set(ids).size === ids.length, 'List each version once'),
  /** Approve drafts whose hours have mostly passed too; without it such drafts are refused. */
  includeStale: z.boolean().default(false),
});

/** What one approval did. */
export const approvedVersionSchema = z.object({
  versionId: z.number().int(),
  seriesId: z.number().int(),
  /** The previously approved version, now superseded (null for a series' first approval). */
  supersededVersionId: z.number().int().nullable(),
});

/** Result of POST /api/forecast-versions/:id/approve and POST /api/forecast-approvals. */
export const approvalResultSchema = z.object({
  approvedAt: z.iso.datetime(),
  approved: z.array(approvedVersionSchema),
});

/** Splits `a,b` (or repeated query parameters) into a list. */
const listParameter = z
  .preprocess((value) => (Array.isArray(value) ? value.join(',') : value), z.string().max(100_000))
  .transform((value) =>
    value
      .split(',')
      .map((part) => part.trim())
      .filter(Boolean),
  );

/**
 * GET /api/exports/forecasts.csv and /api/exports/forecasts: approved forecasts of one or more series
 * (`series=12,14`), of a group (`parent=3`: it and every descendant) or, with neither, of every
 * active series, optionally only those at some hierarchy levels (`seriesLevels=zone,feeder`). Times
 * in `tz` (UTC by default, or an IANA zone); bounds of the interval `levels` (default 80,95).
 */
export const forecastExportQuerySchema = z
  .object({
    series: listParameter
      .transform((parts) => parts.map(Number))
      .pipe(z.array(recordIdSchema).min(1).max(10_000))
      .optional()
      .describe('Series ids, comma-separated, e.g. 12,14'),
    parent: idParamSchema.optional().describe('A hierarchy node: it and all its descendants'),
    tz: z
      .string()
      .default('UTC')
      .refine(isKnownTimeZone, 'Use UTC or an IANA time zone such as America/Chicago')
      .describe('UTC (default) or an IANA time zone, e.g. America/Chicago'),
    levels: z
      .preprocess((value) => value ?? forecastIntervalLevels.join(','), listParameter)
      .transform((parts) => parts.map(Number))
      .pipe(z.array(z.number().refine((level) => (forecastIntervalLevels as readonly number[]).includes(level), 'Levels are 80 and/or 95')))
      .transform((levels) => [...new Set(levels)].sort((a, b) => a - b) as ForecastIntervalLevel[])
      .describe('Interval levels whose bounds to include: 80, 95 or 80,95 (default)'),
    /** Keep only series at these hierarchy levels, e.g. `seriesLevels=zone` for every zone. */
    seriesLevels: listParameter
      .pipe(z.array(z.enum(['system', 'zone', 'substation', 'feeder'])).min(1))
      .optional()
      .describe('Only series at these hierarchy levels, comma-separated: system, zone, substation, feeder'),
  })
  .refine((value) => value.series === undefined || value.parent === undefined, {
    message: 'Send series or parent, not both',
    path: ['parent'],
  });

/** What an export link asks for; see forecastExportQuerySchema. */
export interface ForecastExportLink {
  format: 'csv' | 'json';
  /** Series ids; leave out (with parentId) for the whole system. */
  seriesIds?: readonly number[];
  /** A hierarchy node: it and all its descendants. */
  parentId?: number;
  /** UTC (default) or an IANA time zone. */
  timeZone?: string;
  /** Bounds to include (default 80 and 95). */
  levels?: readonly ForecastIntervalLevel[];
  /** Only series at these hierarchy levels. */
  seriesLevels?: readonly ('system' | 'zone' | 'substation' | 'feeder')[];
}

/** The API path of an export, e.g. `/api/exports/forecasts.csv?parent=3&tz=America%2FChicago`, for download links. */
export function forecastExportPath(link: ForecastExportLink): string {
  const query = new URLSearchParams();
  if (link.seriesIds?.length) query.set('series', link.seriesIds.join(','));
  if (link.parentId !== undefined) query.set('parent', String(link.parentId));
  if (link.timeZone && link.timeZone !== 'UTC') query.set('tz', link.timeZone);
  if (link.levels) query.set('levels', link.levels.join(','));
  if (link.seriesLevels?.length) query.set('seriesLevels', link.seriesLevels.join(','));
  const search = query.toString();
  return `/api/exports/forecasts${link.format === 'csv' ? '.csv' : ''}${search ? `?${search}` : ''}`;
}

/** How every export states its time convention. */
export const exportIntervalConvention =
  'Each row is one interval [interval_start, interval_end): start inclusive, end exclusive. Values are mean demand over the interval in the series unit. Times are ISO 8601 with the UTC offset in force, shown in time_zone.';

/** One exported interval (times in the export's time zone, with offset). */
export const exportedPointSchema = z.object({
  intervalStart: z.string(),
  intervalEnd: z.string(),
  /** The approved mean: adjusted where a planner adjusted it, otherwise the model's. */
  mean: z.number(),
  /** The model's mean before adjustments. */
  modelMean: z.number(),
  adjusted: z.boolean(),
  lower80: z.number().optional(),
  upper80: z.number().optional(),
  lower95: z.number().optional(),
  upper95: z.number().optional(),
});

/** One series' approved forecast in the JSON export. */
export const exportedSeriesSchema = z.object({
  id: z.number().int(),
  key: z.string(),
  name: z.string(),
  level: z.string().nullable(),
  unit: z.string(),
  intervalMinutes: z.number().int(),
  versionId: z.number().int(),
  issuedAt: z.string(),
  approvedAt: z.string().nullable(),
  /** End of the version's last interval (exclusive), in the export's time zone. */
  end: z.string(),
  /** Whole hours of the version still ahead when the export was made. */
  hoursAhead: z.number().int(),
  /** More than half of the version's hours had passed when the export was made: not a forecast of the week ahead. */
  stale: z.boolean(),
  points: z.array(exportedPointSchema),
});

/** GET /api/exports/forecasts (streamed JSON). */
export const forecastExportSchema = z.object({
  generatedAt: z.iso.datetime(),
  timeZone: z.string(),
  intervalConvention: z.string(),
  levels: z.array(z.number().int()),
  series: z.array(exportedSeriesSchema),
  /** Series in scope that have no approved forecast yet. */
  withoutApproved: z.array(z.object({ id: z.number().int(), key: z.string(), name: z.string() })),
});

export type ForecastSeries = z.infer<typeof forecastSeriesSchema>;
export type VersionFit = z.infer<typeof versionFitSchema>;
export type ForecastBand = z.infer<typeof forecastBandSchema>;
export type ForecastPoint = z.infer<typeof forecastPointSchema>;
export type ForecastAdjustment = z.infer<typeof forecastAdjustmentSchema>;
export type DailyPeak = z.infer<typeof dailyPeakSchema>;
export type ForecastWarning = z.infer<typeof forecastWarningSchema>;
export type ForecastVersionSummary = z.infer<typeof forecastVersionSummarySchema>;
export type ForecastVersion = z.infer<typeof forecastVersionSchema>;
export type ForecastVersionDetail = z.infer<typeof forecastVersionDetailSchema>;
export type ActualPoint = z.infer<typeof actualPointSchema>;
export type IntervalDifference = z.infer<typeof intervalDifferenceSchema>;
export type PeakDifference = z.infer<typeof peakDifferenceSchema>;
export type EnergyDifference = z.infer<typeof energyDifferenceSchema>;
export type VersionComparison = z.infer<typeof versionComparisonSchema>;
export type ForecastReview = z.infer<typeof forecastReviewSchema>;
export type ForecastVersionsQuery = z.infer<typeof forecastVersionsQuerySchema>;
export type ForecastVersionPage = z.infer<typeof forecastVersionPageSchema>;
export type CreateAdjustmentRequest = z.infer<typeof createAdjustmentRequestSchema>;
export type ApprovalPreviewRequest = z.infer<typeof approvalPreviewRequestSchema>;
export type HorizonPeak = z.infer<typeof horizonPeakSchema>;
export type ApprovalPreviewItem = z.infer<typeof approvalPreviewItemSchema>;
export type ApprovalPreview = z.infer<typeof approvalPreviewSchema>;
export type BulkApprovalRequest = z.infer<typeof bulkApprovalRequestSchema>;
export type ApprovedVersion = z.infer<typeof approvedVersionSchema>;
export type ApprovalResult = z.infer<typeof approvalResultSchema>;
export type ForecastExportQuery = z.infer<typeof forecastExportQuerySchema>;
export type ExportedPoint = z.infer<typeof exportedPointSchema>;
export type ExportedSeries = z.infer<typeof exportedSeriesSchema>;
export type ForecastExport = z.infer<typeof forecastExportSchema>;
