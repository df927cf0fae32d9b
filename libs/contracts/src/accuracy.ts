/**
 * Forecast accuracy as actuals arrive: every version scored hour by hour against actuals and the
 * seasonal-naive benchmark, summed up by horizon, day type, band kind and version.
 *
 * - GET series/:id/accuracy     data.read  accuracyQuerySchema → seriesAccuracySchema
 * - GET accuracy/overview       data.read  accuracyQuerySchema → accuracyOverviewSchema
 */
import { z } from 'zod';
import { forecastStates } from './forecasts';
import { digitsSchema } from './input';

/** Kinds of local day accuracy is split by. */
export const accuracyDayTypes = ['weekday', 'weekend', 'holiday'] as const;

/** Kinds of prediction band a version carries: calibrated on the series' own errors, or from model standard errors. */
export const accuracyBandKinds = ['empirical', 'gaussian'] as const;

/** How many days back the figures reach (default 28, from the newest scored hour). */
export const accuracyQuerySchema = z.object({
  days: digitsSchema(1, 366, 'the number of days').default(28),
});

/** The accuracy of a set of scored hours (see libs/accuracy for each definition and its source). */
export const accuracySummarySchema = z.object({
  hours: z.number().int(),
  /** Mean absolute error, in the series' unit. */
  mae: z.number(),
  /** Root mean squared error, in the series' unit. */
  rmse: z.number(),
  /** Mean absolute percentage error in percent; null when some actual is 0. */
  mape: z.number().nullable(),
  /** Mean absolute scaled error against the seasonal-naive MAE before each version's origin. */
  mase: z.number().nullable(),
  /** MAE of the seasonal-naive forecast (same hour a week earlier) of the same hours. */
  naiveMae: z.number().nullable(),
  /** 1 − MAE / naive MAE: above 0 beats the same hour a week earlier. */
  skill: z.number().nullable(),
  /** Share of actuals inside the 80 % and 95 % bands (0–1). */
  coverage80: z.number(),
  coverage95: z.number(),
  /** Interval (Winkler) scores of the two bands, in the series' unit; lower is better. */
  winkler80: z.number(),
  winkler95: z.number(),
  /** Mean pinball loss over the four band bounds, in the series' unit; lower is better. */
  pinball: z.number(),
});

/** Daily peak figures over whole local days. */
export const peakSummarySchema = z.object({
  days: z.number().int(),
  meanAbsolutePeakError: z.number(),
  /** Positive: peaks were forecast too high. */
  meanPeakError: z.number(),
  meanAbsolutePeakHourError: z.number(),
  exactPeakHourShare: z.number(),
});

/** One hour of the recent-days chart: the actual and the forecast in force for it. */
export const accuracyHourSchema = z.object({
  ts: z.iso.datetime({ offset: true }),
  actual: z.number(),
  forecast: z.number(),
  lower80: z.number(),
  upper80: z.number(),
  versionId: z.number().int(),
});

/** A version's own accuracy and the band it carries. */
export const versionAccuracySchema = z.object({
  id: z.number().int(),
  state: z.enum(forecastStates),
  bandKind: z.enum(accuracyBandKinds),
  origin: z.iso.datetime({ offset: true }),
  horizonHours: z.number().int(),
  summary: accuracySummarySchema,
  peaks: peakSummarySchema.nullable(),
});

/** Accuracy of one series over a window. */
export const seriesAccuracySchema = z.object({
  seriesId: z.number().int(),
  unit: z.string(),
  timeZone: z.string(),
  /** [from, to) of the figures; null when nothing is scored yet. */
  window: z.object({ from: z.iso.datetime({ offset: true }), to: z.iso.datetime({ offset: true }), days: z.number().int() }).nullable(),
  overall: accuracySummarySchema.nullable(),
  peaks: peakSummarySchema.nullable(),
  /** One entry per horizon hour that has scores, 1 to 168 (and beyond for longer versions). */
  byHorizon: z.array(accuracySummarySchema.extend({ horizon: z.number().int() })),
  byDayType: z.array(accuracySummarySchema.extend({ dayType: z.enum(accuracyDayTypes) })),
  /** Achieved coverage of each band kind the series' versions carried, beside the nominal levels. */
  byBandKind: z.array(accuracySummarySchema.extend({ bandKind: z.enum(accuracyBandKinds), versions: z.number().int() })),
  /** The scored versions, newest origin first (at most 12). */
  versions: z.array(versionAccuracySchema),
  /** The last seven local days of actuals against the forecast in force (approved, else the newest draft). */
  recentHours: z.array(accuracyHourSchema),
});

/** One series on the Overview's accuracy card. */
export const seriesSkillSchema = z.object({
  seriesId: z.number().int(),
  key: z.string(),
  name: z.string(),
  hours: z.number().int(),
  mase: z.number().nullable(),
  mape: z.number().nullable(),
  skill: z.number().nullable(),
  coverage95: z.number(),
});

/** The Overview's accuracy card: pooled skill against seasonal naive and the series that miss most. */
export const accuracyOverviewSchema = z.object({
  window: z.object({ from: z.iso.datetime({ offset: true }), to: z.iso.datetime({ offset: true }), days: z.number().int() }).nullable(),
  /** Hours scored across all series in the window. */
  hours: z.number().int(),
  seriesCount: z.number().int(),
  /** 1 − mean scaled error / mean scaled naive error, pooled over every series (unit-free). */
  skill: z.number().nullable(),
  /** Series with the highest MASE first (at most 5). */
  worst: z.array(seriesSkillSchema),
});

export type AccuracySummaryBody = z.infer<typeof accuracySummarySchema>;
export type PeakSummaryBody = z.infer<typeof peakSummarySchema>;
export type SeriesAccuracy = z.infer<typeof seriesAccuracySchema>;
export type VersionAccuracy = z.infer<typeof versionAccuracySchema>;
export type AccuracyOverview = z.infer<typeof accuracyOverviewSchema>;
export type SeriesSkill = z.infer<typeof seriesSkillSchema>;
