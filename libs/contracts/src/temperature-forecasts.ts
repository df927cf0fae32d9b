/**
 * Temperature forecasts of a weather station as their own data: each issue (when the provider issued it) with
 * its valid hours, kept whole and never overwritten; a refit uses the latest issue made before it runs.
 *
 * Routes (under /api), with the permission each needs:
 * - POST series/:series/temperature-forecasts   data.upload (read-write tokens)  pushTemperatureForecastSchema → 201 temperatureForecastIssueSchema
 * - GET  series/:series/temperature-forecasts   data.read                        → temperatureForecastIssueListSchema
 * - GET  series/:series/temperature-forecast-hours?issuedAt=…   data.read         → temperatureForecastHoursSchema
 * - POST uploads/:id/temperature-forecast   data.upload   temperatureForecastFileSchema → temperatureForecastFileResultSchema
 *   (a CSV file received by POST /api/uploads, read as forecast issues: checked only, or stored all or nothing)
 * Problems: 404 unknown station; 409 when the series is a load series, or an issue with that issue time is
 * stored already (issues are never overwritten); 400 with pointers for values out of range, hours off the hour
 * grid or repeated, or hours more than 72 hours before the issue time.
 *
 * Conventions: `ts` is the start of a valid hour (UTC, on the hour); values arrive in `unit` (°C or °F) and are
 * converted once to the station's own unit when stored.
 */
import { z } from 'zod';
import { instantSchema } from './input';
import { timeZoneSchema } from './series';

/** Most hours one issue may carry: 16 days ahead. */
export const maxTemperatureForecastHours = 384;

/** Plausible air temperatures in °C (−70 to 60); the same range converted for °F. */
export const plausibleTemperatureC = { min: -70, max: 60 } as const;

/** One valid hour of an issue. */
export const temperatureForecastHourSchema = z.object({ ts: instantSchema(), value: z.number() });

/** POST /api/series/:series/temperature-forecasts: one issue, as the weather provider sent it. */
export const pushTemperatureForecastSchema = z.object({
  issuedAt: instantSchema(),
  unit: z.enum(['degC', 'degF']),
  hours: z
    .array(temperatureForecastHourSchema)
    .min(1, 'Send at least one valid hour')
    .max(maxTemperatureForecastHours, `Send at most ${maxTemperatureForecastHours} hours per issue`),
});

/** A stored issue, summarised. */
export const temperatureForecastIssueSchema = z.object({
  seriesId: z.number().int(),
  key: z.string(),
  issuedAt: z.iso.datetime(),
  /** First and last valid hour. */
  from: z.iso.datetime(),
  to: z.iso.datetime(),
  hours: z.number().int(),
  /** The station's unit the values are stored in. */
  unit: z.enum(['degC', 'degF']),
  /** True when the values arrived in the other unit and were converted. */
  converted: z.boolean(),
  min: z.number(),
  max: z.number(),
});

/** The issues of a station, newest first, each with where it came from. */
export const temperatureForecastIssueListSchema = z.object({
  issues: z.array(
    temperatureForecastIssueSchema.omit({ converted: true }).extend({
      /** Where the issue came from, in words: "pushed through the API by token …" or "file … uploaded by …". */
      source: z.string(),
      /** The upload (file or push) that brought it; null for issues stored before uploads were recorded. */
      uploadId: z.number().int().nullable(),
    }),
  ),
});

/** GET /api/series/:series/temperature-forecast-hours query: which issue. */
export const temperatureForecastHoursQuerySchema = z.object({ issuedAt: instantSchema() });

/** The valid hours of one issue, in the station's unit. */
export const temperatureForecastHoursSchema = z.object({
  issuedAt: z.iso.datetime(),
  unit: z.enum(['degC', 'degF']),
  hours: z.array(z.object({ ts: z.iso.datetime(), value: z.number() })),
});

const fileColumn = z.string().min(1, 'Choose a column');

/** POST /api/uploads/:id/temperature-forecast: how a received CSV file holds forecast issues. */
export const temperatureForecastFileSchema = z.object({
  /** The weather station (a temperature series) the issues are for: its key. */
  station: z.string().trim().min(1, 'Choose the weather station').max(64),
  issuedAtColumn: fileColumn,
  validTimeColumn: fileColumn,
  valueColumn: fileColumn,
  /** The unit the file's temperatures are written in; they are converted once to the station's unit. */
  unit: z.enum(['degC', 'degF']),
  /** The zone in which times written without a UTC offset are read. */
  timeZone: timeZoneSchema,
  /** True: read and check the file and show what would be stored, storing nothing. */
  checkOnly: z.boolean().default(false),
});
export type TemperatureForecastFile = z.infer<typeof temperatureForecastFileSchema>;

/** What a forecast file holds (checked) or stored. */
export const temperatureForecastFileResultSchema = z.object({
  uploadId: z.number().int(),
  stored: z.boolean(),
  station: z.object({ id: z.number().int(), key: z.string(), name: z.string(), unit: z.enum(['degC', 'degF']) }),
  /** Data rows in the file. */
  rows: z.number().int(),
  /** The issues found, oldest first; `alreadyStored` when the station holds an issue with that issue time. */
  issues: z.array(temperatureForecastIssueSchema.extend({ alreadyStored: z.boolean() })),
  /** Sentences naming what stops the file from being stored (rows that cannot be read, hours out of range, repeats). */
  problems: z.array(z.string()),
  /** One sentence for the steward. */
  message: z.string(),
});
export type TemperatureForecastFileResult = z.infer<typeof temperatureForecastFileResultSchema>;
export type TemperatureForecastHours = z.infer<typeof temperatureForecastHoursSchema>;

export type PushTemperatureForecast = z.infer<typeof pushTemperatureForecastSchema>;
export type TemperatureForecastIssue = z.infer<typeof temperatureForecastIssueSchema>;
export type TemperatureForecastIssueList = z.infer<typeof temperatureForecastIssueListSchema>;

/** One hour of the temperatures a forecast assumed: observed (before the origin, or reported since) or forecast. */
export const assumedTemperatureHourSchema = z.object({
  ts: z.iso.datetime(),
  value: z.number(),
  source: z.enum(['observed', 'forecast']),
});

/** GET /api/series/:id/assumed-temperatures (data.read): what the reviewed version assumed about the weather. */
export const assumedTemperaturesSchema = z.object({
  /** The version the temperatures belong to (draft, else approved); null when the series has none. */
  versionId: z.number().int().nullable(),
  station: z.object({ id: z.number().int(), key: z.string(), name: z.string(), unit: z.enum(['degC', 'degF']) }).nullable(),
  /** Whether the version's model used temperature, and the fit's words for why or why not. */
  used: z.boolean(),
  reason: z.string(),
  /** The forecast issue the forecast hours came from, when one was used. */
  issuedAt: z.iso.datetime().nullable(),
  /** Observed for the three days before the origin, then what the forecast hours assumed. */
  hours: z.array(assumedTemperatureHourSchema),
});

export type AssumedTemperatures = z.infer<typeof assumedTemperaturesSchema>;
