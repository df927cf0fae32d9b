/**
 * Model settings of a series, the organisation's holiday calendar, and what a fit records about
 * itself (candidates compared by `auto`, residual checks, warnings). Read with data.read, changed
 * with models.edit.
 */
import { z } from 'zod';
import { calendarDateSchema } from './input';

/** Estimation methods a planner can choose; `auto` compares a small candidate set and picks one. */
export const modelMethods = ['auto', 'yule-walker', 'cmle', 'nls', 'ridge', 'lasso', 'seasonal-naive'] as const;
/** One of modelMethods. */
export type ModelMethod = (typeof modelMethods)[number];
/** The methods a fit can end up with (never `auto`). */
export const fittedMethods = ['yule-walker', 'cmle', 'nls', 'ridge', 'lasso', 'seasonal-naive'] as const;
/** One of fittedMethods. */
export type FittedMethod = (typeof fittedMethods)[number];

/** Plain-language names of the methods, for menus and tables. */
export const modelMethodLabels: Record<ModelMethod, string> = {
  auto: 'Automatic choice',
  'yule-walker': 'AR by Yule-Walker',
  cmle: 'AR by conditional maximum likelihood',
  nls: 'ARMA by nonlinear least squares',
  ridge: 'Ridge-penalised AR',
  lasso: 'Lasso-penalised AR',
  'seasonal-naive': 'Seasonal naive (same hour last week)',
};

/**
 * How the daily and weekly shape is handled before the AR/ARMA part: none, an hour-of-week or
 * hour-of-day profile (additive or multiplicative), or seasonal differencing at 24 or 168 hours.
 */
export const seasonalTreatmentSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('none') }),
  z.object({
    kind: z.literal('profile'),
    /** Hour-of-week (168 slots) or hour-of-day (24 slots). */
    slot: z.enum(['hour-of-week', 'hour-of-day']),
    form: z.enum(['additive', 'multiplicative']),
  }),
  z.object({ kind: z.literal('difference'), lag: z.union([z.literal(24), z.literal(168)]) }),
]);
/** See seasonalTreatmentSchema. */
export type SeasonalTreatment = z.infer<typeof seasonalTreatmentSchema>;

/** Temperature regressors: heating and cooling degree-hours around balance points. */
export const temperatureSettingSchema = z
  .object({
    /** Use the linked temperature series when it covers the training window and the horizon. */
    enabled: z.boolean(),
    /** Heating balance point in the temperature series' unit; null takes 15.5 °C (60 °F). */
    heatingBase: z.number().min(-60).max(140).nullable(),
    /** Cooling balance point in the temperature series' unit; null takes 22 °C (72 °F). */
    coolingBase: z.number().min(-60).max(140).nullable(),
  })
  .refine((t) => t.heatingBase === null || t.coolingBase === null || t.heatingBase <= t.coolingBase, {
    message: 'The heating balance point must not be above the cooling balance point',
    path: ['coolingBase'],
  });

/** The settings a planner edits (PUT /api/series/:id/model takes all of them). */
export const modelSettingsFieldsSchema = z.object({
  method: z.enum(modelMethods),
  /** Fixed AR order; null lets the method choose up to maxArOrder (by AIC; ridge/lasso use lags 1..maxArOrder). */
  arOrder: z.number().int().min(0).max(336).nullable(),
  /** Fixed MA order (NLS ARMA only); null lets NLS choose up to maxMaOrder. */
  maOrder: z.number().int().min(0).max(5).nullable(),
  /** Largest AR order considered when arOrder is null. */
  maxArOrder: z.number().int().min(1).max(336),
  /** Largest MA order considered by NLS when maOrder is null. */
  maxMaOrder: z.number().int().min(0).max(5),
  /** Extra lags offered to ridge/lasso beyond 1..maxArOrder, e.g. [168] for the same hour last week. */
  extraLags: z.array(z.number().int().min(1).max(8784)).max(16),
  seasonal: seasonalTreatmentSchema,
  /** Model log(load): intervals become multiplicative; needs strictly positive load. */
  log: z.boolean(),
  temperature: temperatureSettingSchema,
  /**
   * Calendar regressors: Saturday and Sunday-or-holiday indicators, or (with an hour-of-week
   * profile, which already carries the weekday pattern) a holiday indicator alone.
   */
  dayTypes: z.boolean(),
  /** Days of history the model is fitted to, ending at the last reading. */
  trainingWindowDays: z.number().int().min(7).max(3660),
  /** Hours forecast ahead (168 = one week). */
  horizonHours: z.number().int().min(1).max(8784),
  /** Interval levels in percent; 80 and 95 % bounds are always stored with every forecast point. */
  levels: z
    .array(z.number().int().min(1).max(99))
    .min(1)
    .max(6)
    .refine((levels) => new Set(levels).size === levels.length, 'Each level once'),
});

/** PUT /api/series/:id/model: every editable setting, with the cross-field rules. */
export const modelSettingsRequestSchema = modelSettingsFieldsSchema.superRefine((s, ctx) => {
  if (s.maOrder !== null && s.maOrder > 0 && s.method !== 'nls' && s.method !== 'auto') {
    ctx.addIssue({ code: 'custom', path: ['maOrder'], message: 'Only NLS ARMA has an MA part: set the MA order to 0 or empty' });
  }
  if (s.arOrder !== null && s.arOrder > s.maxArOrder) {
    ctx.addIssue({ code: 'custom', path: ['arOrder'], message: 'The AR order must not exceed the largest AR order' });
  }
  if (s.method === 'seasonal-naive' && s.seasonal.kind === 'profile') {
    ctx.addIssue({
      code: 'custom',
      path: ['seasonal'],
      message: 'Seasonal naive repeats last week (or yesterday with 24-hour differencing): choose no seasonal step or differencing',
    });
  }
});

/** GET/PUT /api/series/:id/model response: the settings plus who changed them last. */
export const modelSettingsSchema = modelSettingsFieldsSchema.extend({
  seriesId: z.number().int(),
  /** The linked temperature series the regressors come from, if any. */
  temperatureSeries: z.object({ id: z.number().int(), key: z.string(), name: z.string(), unit: z.string() }).nullable(),
  updatedAt: z.iso.datetime(),
  updatedBy: z.string().nullable(),
});

/** Kinds of calendar entries (those of the holiday package plus the utility's own days). */
export const holidayKinds = ['public', 'bank', 'school', 'optional', 'observance', 'company'] as const;

/** One day of the organisation's holiday calendar. */
export const holidaySchema = z.object({
  id: z.number().int(),
  /** Local date YYYY-MM-DD. */
  day: z.iso.date(),
  name: z.string(),
  kind: z.enum(holidayKinds),
  /** `package`: seeded from the holiday package for the organisation's country/region; `manual`: entered by a planner. */
  source: z.enum(['package', 'manual']),
  updatedAt: z.iso.datetime(),
});

/** GET /api/holidays?from=&to= (local dates, inclusive; default: this year and next). */
export const holidayListQuerySchema = z.object({ from: calendarDateSchema.optional(), to: calendarDateSchema.optional() });

/** GET /api/holidays response: the calendar and where its package days come from. */
export const holidayCalendarSchema = z.object({
  country: z.string().nullable(),
  region: z.string().nullable(),
  holidays: z.array(holidaySchema),
});

/** POST /api/holidays: add a day (a planner's own day off, e.g. a plant shutdown). */
export const createHolidayRequestSchema = z.object({
  day: calendarDateSchema,
  name: z.string().trim().min(1, 'Name the day').max(120),
  kind: z.enum(holidayKinds).default('company'),
});

/** POST /api/holidays/seed: fill the calendar from the holiday package for these years. */
export const seedHolidaysRequestSchema = z.object({ years: z.array(z.number().int().min(1990).max(2100)).min(1).max(20) });
/** POST /api/holidays/seed response. */
export const seedHolidaysResultSchema = z.object({ added: z.number().int() });

/** One candidate `auto` compared: its information criteria and short-backtest scores. */
export const fitCandidateSchema = z.object({
  /** e.g. "cmle AR(3)", "lasso AR (lags 1–48, 168)", "NLS ARMA(2,1)", "seasonal naive". */
  label: z.string(),
  method: z.enum(fittedMethods),
  p: z.number().int(),
  q: z.number().int(),
  aic: z.number().nullable(),
  bic: z.number().nullable(),
  /** Mean absolute error over the backtest steps (series' unit). */
  backtestMae: z.number().nullable(),
  backtestRmse: z.number().nullable(),
  /** Mean absolute percentage error over the backtest steps, percent (fits before this field: absent). */
  backtestMape: z.number().nullable().optional(),
  /** Share of backtest hours inside the candidate's 80 % and 95 % Gaussian bands, percent. */
  coverage80: z.number().nullable().optional(),
  coverage95: z.number().nullable().optional(),
  /** Ljung-Box test of the candidate's estimation residuals at 48 lags. */
  ljungBox: z.object({ statistic: z.number(), df: z.number().int(), pValue: z.number() }).nullable().optional(),
  /** 1 − MAE / seasonal-naive MAE on the same steps (positive: better than the benchmark). */
  skill: z.number().nullable(),
  fitMs: z.number(),
  /** Why the candidate has no scores (it failed). */
  error: z.string().nullable(),
  /** Why the candidate was not chosen, in plain words (null for the chosen one). */
  note: z.string().nullable().optional(),
  chosen: z.boolean(),
});

/** What `auto` compared and why it chose what it chose. */
export const fitSelectionSchema = z.object({
  rule: z.string(),
  reason: z.string(),
  /** Backtest layout, e.g. 3 origins × 24 hours at the end of the window. */
  backtest: z.object({ origins: z.number().int(), horizon: z.number().int() }),
  candidates: z.array(fitCandidateSchema),
});

/** Which kind of prediction band a forecast carries. */
export const forecastBandKinds = ['empirical', 'gaussian'] as const;

/**
 * How a forecast's bands were made: `empirical` (calibrated on the series' own rolling-origin errors,
 * split conformal by horizon band and hour of day) or `gaussian` (ψ-weight standard errors, the fallback
 * for short histories and seasonal naive); `scale` says whether they were set on log load.
 */
export const forecastBandsSchema = z.object({
  kind: z.enum(forecastBandKinds),
  scale: z.enum(['load', 'log']),
  /** Daily origins and errors the calibration used (0 for Gaussian bands). */
  origins: z.number().int(),
  scores: z.number().int(),
  reason: z.string(),
});
export type ForecastBands = z.infer<typeof forecastBandsSchema>;

/** A note on how a forecast was made, e.g. `temperature-fallback`. */
export const fitWarningSchema = z.object({
  code: z.string(),
  message: z.string(),
  /** What to do about it, e.g. "Difference the series (weekly or daily) and fit again." */
  suggestion: z.string().optional(),
});

/** Residual checks and settings effects recorded with every fit. */
export const fitDiagnosticsSchema = z.object({
  /** Residual autocorrelations at lags 1..n. */
  residualAcf: z.array(z.number()),
  /** Half-width of the ±1.96/√n white-noise band. */
  acfBand: z.number(),
  ljungBox: z.object({ lags: z.number().int(), statistic: z.number(), pValue: z.number(), df: z.number().int() }).nullable(),
  /** Whether temperature regressors were used, and why not when they were not. */
  temperature: z.object({
    used: z.boolean(),
    reason: z.string(),
    /** Issue time of the temperature forecast issue the forecast hours came from, when one was used. */
    forecastIssuedAt: z.iso.datetime().optional(),
  }),
  warnings: z.array(fitWarningSchema),
  /** The kind of band the fit's forecast carries (fits made before calibration existed: absent). */
  bands: forecastBandsSchema.optional(),
});

/** GET /api/series/:id/fit: the newest fit of a series. */
export const fitSummarySchema = z.object({
  id: z.number().int(),
  seriesId: z.number().int(),
  method: z.enum(fittedMethods),
  arOrder: z.number().int(),
  maOrder: z.number().int(),
  parameters: z.record(z.string(), z.unknown()),
  sigma2: z.number().nullable(),
  aic: z.number().nullable(),
  bic: z.number().nullable(),
  dataStart: z.iso.datetime(),
  dataEnd: z.iso.datetime(),
  observationCount: z.number().int(),
  durationMs: z.number().int(),
  createdAt: z.iso.datetime(),
  diagnostics: fitDiagnosticsSchema,
  /** Present when the settings said `auto`. */
  selection: fitSelectionSchema.nullable(),
});

export type ModelSettingsRequest = z.infer<typeof modelSettingsRequestSchema>;
export type ModelSettings = z.infer<typeof modelSettingsSchema>;
export type TemperatureSetting = z.infer<typeof temperatureSettingSchema>;
export type Holiday = z.infer<typeof holidaySchema>;
export type HolidayCalendar = z.infer<typeof holidayCalendarSchema>;
export type CreateHolidayRequest = z.infer<typeof createHolidayRequestSchema>;
export type FitCandidate = z.infer<typeof fitCandidateSchema>;
export type FitSelection = z.infer<typeof fitSelectionSchema>;
export type FitDiagnostics = z.infer<typeof fitDiagnosticsSchema>;
export type FitSummary = z.infer<typeof fitSummarySchema>;
