/**
 * The series catalogue: every measured load (system, zone, substation, feeder) and every weather
 * station temperature, with the settings that say how its readings are to be read. Shared by the
 * API (which enforces these rules) and the web app's catalogue table, series page and edit form.
 */
import { z } from 'zod';
import { digitsSchema, int4Max, recordIdSchema } from './input';

/** What a series measures. */
export const seriesKinds = ['load', 'temperature'] as const;
export type SeriesKind = (typeof seriesKinds)[number];

/** Network levels, from the whole system down to one feeder (temperature series have none). */
export const seriesLevels = ['system', 'zone', 'substation', 'feeder'] as const;
export type SeriesLevel = (typeof seriesLevels)[number];

/** Depth of each level: a parent must have a smaller depth than its child (system > zone > substation > feeder). */
export const seriesLevelDepth: Record<SeriesLevel, number> = { system: 0, zone: 1, substation: 2, feeder: 3 };

/** Units of stored values: load as mean demand over the interval, temperature in degrees. */
export const seriesUnits = ['W', 'kW', 'MW', 'degC', 'degF'] as const;
export type SeriesUnit = (typeof seriesUnits)[number];

/** The units each kind may be stored in. */
export const unitsByKind: Record<SeriesKind, readonly SeriesUnit[]> = { load: ['W', 'kW', 'MW'], temperature: ['degC', 'degF'] };

/** Interval lengths Loadwright accepts, in minutes (1440 is daily). */
export const seriesIntervalMinutes = [5, 15, 30, 60, 1440] as const;
export type SeriesIntervalMinutes = (typeof seriesIntervalMinutes)[number];

/** Whether a reading's timestamp marks the start or the end of its interval. */
export const timestampsMarks = ['start', 'end'] as const;
export type TimestampsMark = (typeof timestampsMarks)[number];

/** Keys are what files and other systems name a series by: lower-case letters, digits and hyphens, starting with a letter (so a key never reads as an id). */
export const seriesKeyPattern = /^[a-z][a-z0-9-]*$/;

/** A series key as entered in the catalogue. */
export const seriesKeySchema = z
  .string()
  .trim()
  .min(2, 'A key needs at least 2 characters')
  .max(64, 'A key has at most 64 characters')
  .regex(seriesKeyPattern, 'Use lower-case letters a–z, digits 0–9 and hyphens, starting with a letter (e.g. fdr-n1)');

/** True when `name` is an IANA time zone this runtime knows (e.g. America/Chicago, UTC). */
export function isIanaTimeZone(name: string): boolean {
  if (!/^[A-Za-z][A-Za-z0-9_+\-/]*$/.test(name)) return false;
  if (name === 'UTC' || Intl.supportedValuesOf('timeZone').includes(name)) return true;
  try {
    // Some valid names (aliases such as Etc/UTC or US/Central) are not in the canonical list.
    new Intl.DateTimeFormat('en', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

/** An IANA time zone name. */
export const timeZoneSchema = z
  .string()
  .trim()
  .min(1, 'Enter a time zone')
  .refine(isIanaTimeZone, 'Not an IANA time zone name; use a name such as America/Chicago or Europe/Berlin');

/** A reference to another series in the catalogue, as shown beside a series. */
export const seriesRefSchema = z.object({
  id: z.number().int(),
  key: z.string(),
  name: z.string(),
  kind: z.enum(seriesKinds),
  level: z.enum(seriesLevels).nullable(),
  unit: z.enum(seriesUnits),
  archived: z.boolean(),
});

/** One row of the catalogue table. */
export const seriesSummarySchema = z.object({
  id: z.number().int(),
  key: z.string(),
  name: z.string(),
  kind: z.enum(seriesKinds),
  /** Null for temperature series, which sit outside the network hierarchy. */
  level: z.enum(seriesLevels).nullable(),
  parentId: z.number().int().nullable(),
  /** Key of the parent, for display without a second request. */
  parentKey: z.string().nullable(),
  unit: z.enum(seriesUnits),
  intervalMinutes: z.number().int(),
  timeZone: z.string(),
  timestampsMark: z.enum(timestampsMarks),
  /** The weather station whose temperature drives this load (load series only). */
  temperatureSeriesId: z.number().int().nullable(),
  temperatureSeriesKey: z.string().nullable(),
  /** Series of similar behaviour whose models lend a prior to a new member. */
  peerGroup: z.string().nullable(),
  description: z.string().nullable(),
  /** When the series was archived; archived series are hidden by default and never refit. */
  archivedAt: z.iso.datetime().nullable(),
  /** Time of the newest stored reading, null when there is none. */
  latestReadingAt: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
});

/** Counts of a series' stored readings. */
export const seriesReadingStatsSchema = z.object({
  /** Stored rows (raw readings plus rows that carry only an estimate for a missing interval). */
  count: z.number().int(),
  firstAt: z.iso.datetime().nullable(),
  latestAt: z.iso.datetime().nullable(),
  /** Rows carrying each quality flag (names as in `qualityFlagNames`); flags with no rows are 0. */
  byQuality: z.record(z.string(), z.number().int()),
  /** Rows with no flag at all. */
  clean: z.number().int(),
});

/** GET /api/series/:id: one series with its place in the hierarchy and its readings at a glance. */
export const seriesDetailSchema = seriesSummarySchema.extend({
  /** Ancestors from the top of the hierarchy down to the direct parent. */
  parentChain: z.array(seriesRefSchema),
  /** Direct children, archived ones included. */
  childrenCount: z.number().int(),
  /** Direct children that are not archived. */
  activeChildrenCount: z.number().int(),
  temperatureSeries: seriesRefSchema.nullable(),
  /** For a temperature series: how many load series use it as their weather station. */
  linkedLoadCount: z.number().int(),
  readings: seriesReadingStatsSchema,
});

/** Which series the catalogue lists: archived ones only on request. */
export const archivedFilters = ['false', 'true', 'all'] as const;

/** Sort keys of the catalogue table. */
export const seriesSortKeys = ['key', 'name', 'level', 'updated'] as const;
export type SeriesSortKey = (typeof seriesSortKeys)[number];

/** Query-string boolean: only the words true and false (a bare `z.coerce.boolean` reads "false" as true). */
const queryBoolean = z.enum(['true', 'false']).transform((value) => value === 'true');

/** GET /api/series: filters, sort and paging of the catalogue table. */
export const seriesListQuerySchema = z.object({
  kind: z.enum(seriesKinds).optional(),
  level: z.enum(seriesLevels).optional(),
  /** Id or key of a parent: lists its children (or, with `descendants=true`, its whole subtree). */
  parent: z.string().trim().min(1).max(64).optional(),
  descendants: queryBoolean.default(false),
  /** Case-insensitive text searched in key and name. */
  q: z.string().trim().max(100).optional(),
  /** `false` (default): live series only; `true`: archived only; `all`: both. */
  archived: z.enum(archivedFilters).default('false'),
  sort: z.enum(seriesSortKeys).default('key'),
  order: z.enum(['asc', 'desc']).default('asc'),
  /** Rows to skip (page index × page size). */
  offset: digitsSchema(0, int4Max).default(0),
  /** Page size, at most 200. */
  limit: digitsSchema(1, 200).default(50),
});

/** One page of the catalogue with the number of rows all pages hold. */
export const seriesPageSchema = z.object({
  items: z.array(seriesSummarySchema),
  total: z.number().int(),
  offset: z.number().int(),
  limit: z.number().int(),
});

const nameSchema = z.string().trim().min(1, 'Enter a name').max(200, 'A name has at most 200 characters');
const optionalText = (max: number) => z.string().trim().max(max).nullable().optional();
const idOrNull = recordIdSchema.nullable().optional();

/** The fields a steward sets on a series; `create` and `update` refine them. */
const seriesFields = {
  key: seriesKeySchema,
  name: nameSchema,
  kind: z.enum(seriesKinds),
  /** Required for load series; must be null or absent for temperature series. */
  level: z.enum(seriesLevels).nullable().optional(),
  /** A series of a higher level (system > zone > substation > feeder). */
  parentId: idOrNull,
  unit: z.enum(seriesUnits),
  intervalMinutes: z.literal(seriesIntervalMinutes, 'Interval must be 5, 15, 30, 60 or 1440 (daily) minutes'),
  timeZone: timeZoneSchema,
  timestampsMark: z.enum(timestampsMarks).default('start'),
  /** A series of kind temperature (load series only). */
  temperatureSeriesId: idOrNull,
  peerGroup: optionalText(80),
  description: optionalText(2000),
};

/** Checks the rules that tie fields of one series together (the ones that need no database). */
function checkKindRules(
  value: {
    kind?: SeriesKind;
    unit?: SeriesUnit;
    level?: SeriesLevel | null;
    parentId?: number | null;
    temperatureSeriesId?: number | null;
  },
  context: z.RefinementCtx,
): void {
  const { kind, unit, level } = value;
  if (kind && unit && !unitsByKind[kind].includes(unit)) {
    context.addIssue({
      code: 'custom',
      path: ['unit'],
      message: `A ${kind} series is stored in ${unitsByKind[kind].join(', ')}, not ${unit}`,
    });
  }
  if (kind === 'load' && level === undefined) return; // a partial update may keep the stored level
  if (kind === 'load' && !level)
    context.addIssue({ code: 'custom', path: ['level'], message: 'A load series needs a level: system, zone, substation or feeder' });
  if (kind === 'temperature') {
    if (level)
      context.addIssue({
        code: 'custom',
        path: ['level'],
        message: 'A temperature series has no level: it sits outside the network hierarchy',
      });
    if (value.parentId)
      context.addIssue({
        code: 'custom',
        path: ['parentId'],
        message: 'A temperature series has no parent: it sits outside the network hierarchy',
      });
    if (value.temperatureSeriesId)
      context.addIssue({ code: 'custom', path: ['temperatureSeriesId'], message: 'Only load series link to a temperature series' });
  }
}

/** POST /api/series */
export const createSeriesRequestSchema = z.object(seriesFields).superRefine(checkKindRules);

/**
 * PATCH /api/series/:id: any of the fields, at least one. The server checks the series as it would
 * be after the change against the same rules as a new one. The kind cannot change; unit and interval
 * cannot change once readings are stored (they would change what the stored numbers mean).
 */
export const updateSeriesRequestSchema = z
  .object(seriesFields)
  .extend({ timestampsMark: z.enum(timestampsMarks) })
  .partial()
  .refine((value) => Object.keys(value).length > 0, 'Send at least one field to change');

export type SeriesRef = z.infer<typeof seriesRefSchema>;
export type SeriesSummary = z.infer<typeof seriesSummarySchema>;
export type SeriesReadingStats = z.infer<typeof seriesReadingStatsSchema>;
export type SeriesDetail = z.infer<typeof seriesDetailSchema>;
export type SeriesListQuery = z.infer<typeof seriesListQuerySchema>;
export type SeriesPage = z.infer<typeof seriesPageSchema>;
export type CreateSeriesRequest = z.infer<typeof createSeriesRequestSchema>;
export type UpdateSeriesRequest = z.infer<typeof updateSeriesRequestSchema>;
