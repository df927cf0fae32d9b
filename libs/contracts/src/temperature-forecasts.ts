/**
 * Temperature forecasts of a weather station as their own data: each issue (when the provider issued it) with
 * its valid hours, kept whole and never overwritten; a refit uses the latest issue made before it runs.
 *
 * Routes (under /api), with the permission each needs:
 * - POST series/:series/temperature-forecasts   data.upload (read-write tokens)  pushTemperatureForecastSchema → 201 temperatureForecastIssueSchema
 * - GET  series/:series/temperature-forecasts   data.read                        → temperatureForecastIssueListSchema
 * Problems: 404 unknown station; 409 when the series is a load series, or an issue with that issue time is
 * stored already (issues are never overwritten); 400 with pointers for values out of range, hours off the hour
 * grid or repeated, or hours more than 72 hours before the issue time.
 *
 * Conventions: `ts` is the start of a valid hour (UTC, on the hour); values arrive in `unit` (°C or °F) and are
 * converted once to the station's own unit when stored.
 */
import { z } from 'zod';
import { instantSchema } from './input';

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

/** The issues of a station, newest first. */
export const temperatureForecastIssueListSchema = z.object({ issues: z.array(temperatureForecastIssueSchema.omit({ converted: true })) });

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
