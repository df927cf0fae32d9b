/**
 * Readings of one series: the history the series page charts (raw values, estimates and quality
 * flags, aggregated by local day over long ranges), the push API through which other systems send
 * actuals, and the answer of a Green Button import.
 */
import { z } from 'zod';
import { instantSchema, isWithinYearRange } from './input';
import { seriesUnits } from './series';

/**
 * Quality bits of a stored reading, OR-ed together (a clean raw reading has none). The same bits as
 * the database's `qualityFlag`; a unit check keeps the two lists equal.
 */
export const qualityFlagBits = {
  /** An estimate is given to use instead of (or in place of a missing) raw reading. */
  estimated: 1 << 0,
  /** No raw reading arrived for this interval; the row carries only an estimate. */
  missing: 1 << 1,
  /** The robust spike test (Hampel/MAD) flagged the raw value. */
  spike: 1 << 2,
  /** Part of a run of identical values longer than the flat-line limit. */
  flatLine: 1 << 3,
  /** Below zero where the series cannot be negative. */
  negative: 1 << 4,
  /** Outside the physically possible range for the series. */
  impossible: 1 << 5,
  /** The upload held conflicting values for this instant; the first was kept. */
  duplicateConflict: 1 << 6,
  /** Local time fell in a repeated daylight-saving hour and was resolved by the upload settings. */
  dstAmbiguous: 1 << 7,
  /** A person edited the estimate by hand. */
  manualEdit: 1 << 8,
  /** Excluded from model training by a steward. */
  excluded: 1 << 9,
} as const;

/** Name of one quality flag. */
export type QualityFlagName = keyof typeof qualityFlagBits;

/** Every quality flag name, in bit order. */
export const qualityFlagNames = Object.keys(qualityFlagBits) as QualityFlagName[];

/** The flag names set in a quality bit field, in bit order. */
export function qualityFlagsOf(quality: number): QualityFlagName[] {
  return qualityFlagNames.filter((name) => (quality & qualityFlagBits[name]) !== 0);
}

/** Short labels of the quality flags, for legends and tooltips. */
export const qualityFlagLabels: Record<QualityFlagName, string> = {
  estimated: 'Estimated',
  missing: 'Missing',
  spike: 'Spike',
  flatLine: 'Flat line',
  negative: 'Negative',
  impossible: 'Impossible value',
  duplicateConflict: 'Conflicting duplicate',
  dstAmbiguous: 'Repeated DST hour',
  manualEdit: 'Edited by hand',
  excluded: 'Excluded from training',
};

/** A quality flag name, checked. */
export const qualityFlagNameSchema = z.enum(qualityFlagNames as [QualityFlagName, ...QualityFlagName[]]);

/** How finely the history is returned: each stored reading, or aggregated per hour or per local day. */
export const readingResolutions = ['interval', 'hour', 'day'] as const;
export type ReadingResolution = (typeof readingResolutions)[number];

/** Above this span, `auto` aggregates by local day so the chart stays fast. */
export const autoDailyAboveDays = 60;

/** Above this many stored intervals in the range, `auto` aggregates by hour (sub-hourly series). */
export const autoHourlyAbovePoints = 10_000;

/** Span returned when the request names no range: the last 30 days up to the newest reading. */
export const defaultHistoryDays = 30;

/** The longest range one request may ask for. */
export const maxHistoryDays = 3660;

/** GET /api/series/:series/readings (`:series` is the id or the key). */
export const readingHistoryQuerySchema = z
  .object({
    /** Start of the range, inclusive (ISO 8601 with offset). Default: `defaultHistoryDays` before `to`. */
    from: instantSchema({ offset: true }).optional(),
    /** End of the range, exclusive. Default: just after the newest reading (or now when there is none). */
    to: instantSchema({ offset: true }).optional(),
    /** `auto` (default): by day above `autoDailyAboveDays`, by hour above `autoHourlyAbovePoints` intervals, else each reading. */
    resolution: z.enum(['auto', ...readingResolutions]).default('auto'),
  })
  .refine((q) => !q.from || !q.to || Date.parse(q.from) < Date.parse(q.to), { message: '`from` must be before `to`', path: ['from'] })
  .refine((q) => !q.from || !q.to || Date.parse(q.to) - Date.parse(q.from) <= maxHistoryDays * 86_400_000, {
    message: `Ask for at most ${maxHistoryDays} days at once`,
    path: ['to'],
  });

/** One stored reading. */
export const readingPointSchema = z.object({
  /** Start of the interval (the store keeps interval starts, whatever the series' timestamps mark). */
  ts: z.iso.datetime(),
  /** Raw reading as received, in the series' unit; null when the interval is missing and only an estimate exists. */
  value: z.number().nullable(),
  /** Value to use in place of the raw one (gap fill, spike replacement); null when none. */
  estimated: z.number().nullable(),
  /** The quality bits (see `qualityFlagBits`). */
  quality: z.number().int(),
  /** The same bits by name. */
  flags: z.array(qualityFlagNameSchema),
});

/** Readings of one hour or one local day, aggregated. */
export const readingBucketSchema = z.object({
  /** Start of the bucket: the hour, or local midnight of the day in the series' time zone. */
  ts: z.iso.datetime(),
  /** The local calendar day (YYYY-MM-DD) for daily buckets; null for hourly ones. */
  day: z.string().nullable(),
  /** Mean, smallest and largest raw value in the bucket; null when it holds no raw value. */
  mean: z.number().nullable(),
  min: z.number().nullable(),
  max: z.number().nullable(),
  /** Mean of the values to use: the estimate where there is one, else the raw value. */
  meanUsed: z.number().nullable(),
  /** Stored rows in the bucket. */
  count: z.number().int(),
  /** Rows in the bucket that carry an estimate. */
  estimatedCount: z.number().int(),
  /** Every quality bit set on any reading of the bucket (OR). */
  quality: z.number().int(),
  flags: z.array(qualityFlagNameSchema),
});

const historyBase = {
  seriesId: z.number().int(),
  key: z.string(),
  unit: z.enum(seriesUnits),
  intervalMinutes: z.number().int(),
  timeZone: z.string(),
  from: z.iso.datetime(),
  to: z.iso.datetime(),
  /** Stored rows in the range. */
  readingCount: z.number().int(),
  /** Rows in the range carrying each flag (every flag name present, 0 when none). */
  qualitySummary: z.record(z.string(), z.number().int()),
};

/** The history for the chart: `points` at interval resolution, `buckets` when aggregated. */
export const readingHistorySchema = z.discriminatedUnion('resolution', [
  z.object({ ...historyBase, resolution: z.literal('interval'), points: z.array(readingPointSchema) }),
  z.object({ ...historyBase, resolution: z.enum(['hour', 'day']), buckets: z.array(readingBucketSchema) }),
]);

/** Most readings one push may carry; larger batches are split by the sender. */
export const maxPushReadings = 20_000;

/** One reading pushed by another system. */
export const pushedReadingSchema = z.object({
  /**
   * The instant as the series' timestamps mark it (start or end of the interval), ISO 8601 with a
   * UTC offset or Z; local times without an offset are ambiguous and refused.
   */
  ts: z.iso
    .datetime({
      offset: true,
      error: 'Give the time as ISO 8601 with an offset, e.g. 2026-01-15T14:00:00-06:00 or 2026-01-15T20:00:00Z',
    })
    .refine(isWithinYearRange, 'Give a time from the years 1900 to 2200'),
  value: z.number({ error: 'Give the value as a number' }).refine(Number.isFinite, 'Give a finite number'),
});

/** POST /api/series/:series/readings: actuals from another system. */
export const pushReadingsRequestSchema = z.object({
  readings: z
    .array(pushedReadingSchema)
    .min(1, 'Send at least one reading')
    .max(maxPushReadings, `Send at most ${maxPushReadings} readings per request; split larger batches`),
  /** Unit of the values when not the series' own; converted within the kind (W, kW, MW or degC, degF). */
  unit: z.enum(seriesUnits).optional(),
});

/** One thing validation found in imported readings. */
export const importFindingSchema = z.object({
  /** The validation rule, e.g. spike, gap, duplicate_conflict, off_grid, future. */
  rule: z.string(),
  /** Interval start of the reading concerned, when there is one. */
  ts: z.iso.datetime().nullable(),
  value: z.number().nullable(),
  /** 1-based position of the reading in the pushed `readings` array (null for Green Button files and gaps). */
  position: z.number().int().nullable(),
  /** Rule-specific facts: the limit crossed, the estimate's method, the length of a gap. */
  detail: z.record(z.string(), z.unknown()),
});

/** What an import (push or Green Button file) did. */
export const importResultSchema = z.object({
  seriesId: z.number().int(),
  key: z.string(),
  /** The upload record of this batch (null when nothing was recorded). */
  uploadId: z.number().int().nullable(),
  /** True when the same batch had already been imported: nothing was added. */
  alreadyImported: z.boolean(),
  received: z.number().int(),
  inserted: z.number().int(),
  unchanged: z.number().int(),
  /** Readings that corrected a stored value (the old one is kept as a revision). */
  revised: z.number().int(),
  /** Readings not stored: repeated instants, instants off the interval grid, readings in the future. */
  rejected: z.number().int(),
  /** Findings by rule. */
  findingCounts: z.record(z.string(), z.number().int()),
  /** The first few findings of each rule, for a quick look (the counts cover all). */
  findings: z.array(importFindingSchema),
});

/** Local time parameters of a Green Button feed, as recorded with the import. */
export const greenButtonLocalTimeSchema = z.object({
  /** Offset of standard time from UTC, seconds. */
  tzOffsetSeconds: z.number().int(),
  /** Extra offset while daylight-saving time is in force, seconds. */
  dstOffsetSeconds: z.number().int(),
  /** The feed's daylight-saving start and end rules (hex-encoded, as given). */
  dstStartRule: z.string().nullable(),
  dstEndRule: z.string().nullable(),
});

/**
 * POST /api/series/:series/green-button answers with this: what the Green Button file held, beside
 * the import counts. The file is the request body, sent as one of `greenButtonMediaTypes`.
 */
export const greenButtonImportResultSchema = importResultSchema.extend({
  /** The reading type: unit of measure code and name, multiplier, interval length and accumulation. */
  readingType: z.object({
    uom: z.number().int(),
    uomName: z.string(),
    powerOfTenMultiplier: z.number().int(),
    intervalLengthSeconds: z.number().int().nullable(),
    accumulationBehaviour: z.number().int().nullable(),
  }),
  localTime: greenButtonLocalTimeSchema.nullable(),
  /** First and last interval start in the file. */
  firstIntervalStart: z.iso.datetime(),
  lastIntervalStart: z.iso.datetime(),
});

/** Largest Green Button file accepted, bytes. */
export const maxGreenButtonBytes = 20 * 1024 * 1024;

/** Content types a Green Button file may be sent as. */
export const greenButtonMediaTypes = ['application/xml', 'application/atom+xml', 'text/xml'] as const;

export type ReadingHistoryQuery = z.infer<typeof readingHistoryQuerySchema>;
export type ReadingPoint = z.infer<typeof readingPointSchema>;
export type ReadingBucket = z.infer<typeof readingBucketSchema>;
export type ReadingHistory = z.infer<typeof readingHistorySchema>;
export type PushedReading = z.infer<typeof pushedReadingSchema>;
export type PushReadingsRequest = z.infer<typeof pushReadingsRequestSchema>;
export type ImportFinding = z.infer<typeof importFindingSchema>;
export type ImportResult = z.infer<typeof importResultSchema>;
export type GreenButtonLocalTime = z.infer<typeof greenButtonLocalTimeSchema>;
export type GreenButtonImportResult = z.infer<typeof greenButtonImportResultSchema>;
