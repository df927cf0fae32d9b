/** Misses (events, rules, the Overview's summary), the organisation's settings and each person's miss e-mail choice. */
import { z } from 'zod';
import { digitsSchema, idParamSchema, instantSchema, recordIdSchema } from './input';
import { seriesLevels } from './series';

export const missRuleKinds = [
  'outside_band',
  'error_over_threshold',
  'daily_peak_missed',
  'creeping_bias',
  'actuals_late',
  'forecast_late',
  'estimated_hours',
] as const;
export const missSeverities = ['low', 'medium', 'high'] as const;
export const missStates = ['open', 'acknowledged', 'resolved'] as const;
export const missMailChoices = ['by_severity', 'immediate', 'digest', 'none'] as const;

/** A miss as listed. */
export const missSummarySchema = z.object({
  id: z.number().int(),
  seriesId: z.number().int(),
  seriesKey: z.string(),
  seriesName: z.string(),
  level: z.enum(seriesLevels).nullable(),
  unit: z.string(),
  timeZone: z.string(),
  ruleId: z.number().int(),
  kind: z.enum(missRuleKinds),
  /** The kind's plain name, e.g. "Outside the band". */
  kindName: z.string(),
  severity: z.enum(missSeverities),
  state: z.enum(missStates),
  periodStart: z.iso.datetime(),
  periodEnd: z.iso.datetime(),
  detectedAt: z.iso.datetime(),
  summary: z.string(),
  /** The likely cause in words, once known. */
  cause: z.string().nullable(),
});

/** GET /api/misses filters. */
export const missListQuerySchema = z.object({
  series: z.string().trim().min(1).optional(),
  level: z.enum(seriesLevels).optional(),
  severity: z.enum(missSeverities).optional(),
  state: z.enum(missStates).optional(),
  from: instantSchema({ offset: true }).optional(),
  to: instantSchema({ offset: true }).optional(),
  limit: digitsSchema(1, 500).default(100),
});

/** One hour of a miss's evidence. */
export const missHourSchema = z.object({
  ts: z.iso.datetime(),
  actual: z.number().nullable(),
  forecast: z.number().nullable(),
  lower: z.number().nullable(),
  upper: z.number().nullable(),
  error: z.number().nullable(),
  percentError: z.number().nullable(),
  estimated: z.boolean(),
  versionId: z.number().int().nullable(),
});

/** A comment on a miss. */
export const missCommentSchema = z.object({
  id: z.number().int(),
  authorName: z.string().nullable(),
  body: z.string(),
  createdAt: z.iso.datetime(),
});

/** One hour of the miss chart: actual, forecast and band of the version in force, and the temperature. */
export const missChartPointSchema = z.object({
  ts: z.iso.datetime(),
  actual: z.number().nullable(),
  forecast: z.number().nullable(),
  lower95: z.number().nullable(),
  upper95: z.number().nullable(),
  temperature: z.number().nullable(),
});

/** GET /api/misses/:id */
export const missDetailSchema = missSummarySchema.extend({
  versionId: z.number().int().nullable(),
  hours: z.array(missHourSchema),
  flags: z.array(z.string()),
  split: z
    .object({ hours: z.number(), meanError: z.number(), temperaturePart: z.number(), modelPart: z.number(), temperatureError: z.number() })
    .nullable(),
  acknowledgedBy: z.string().nullable(),
  acknowledgedAt: z.iso.datetime().nullable(),
  resolvedBy: z.string().nullable(),
  resolvedAt: z.iso.datetime().nullable(),
  comments: z.array(missCommentSchema),
  chart: z.array(missChartPointSchema),
  temperatureUnit: z.string().nullable(),
});

/** POST /api/misses/:id/acknowledge and /comments */
export const missCommentRequestSchema = z.object({ comment: z.string().trim().min(1, 'Say what you know or will do').max(2000) });
/** POST /api/misses/:id/resolve */
export const missResolveRequestSchema = z.object({ comment: z.string().trim().max(2000).optional() });

/** GET /api/misses/overview: for the Overview page. */
export const missOverviewSchema = z.object({
  open: z.object({ low: z.number().int(), medium: z.number().int(), high: z.number().int() }),
  worstSeries: z.array(
    z.object({
      seriesId: z.number().int(),
      seriesKey: z.string(),
      seriesName: z.string(),
      open: z.number().int(),
      highest: z.enum(missSeverities),
      latestMissId: z.number().int(),
    }),
  ),
});

/** The parameters of a rule a person sets; each kind reads some of them (`reads`). */
export const missRuleParameters = ['hours', 'threshold', 'bandLevel', 'floorKw', 'peakHourTolerance'] as const;
export type MissRuleParameter = (typeof missRuleParameters)[number];

/** An e-mail address, or `role:<role>` for everyone active in that role. */
const recipientSchema = z
  .string()
  .trim()
  .regex(
    /^(role:(admin|steward|planner|viewer)|[^@\s]+@[^@\s]+\.[^@\s]+)$/,
    'Each recipient is an e-mail address (name@example.org) or a role written role:planner',
  );

/** A miss rule as Settings and the Misses page show it. */
export const missRuleSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  kind: z.enum(missRuleKinds),
  kindName: z.string(),
  /** What the kind watches, in a sentence. */
  watches: z.string(),
  /** What the threshold means for this kind, or null when it takes none. */
  thresholdMeaning: z.string().nullable(),
  /** The parameters this kind reads; the others are ignored. */
  reads: z.array(z.enum(missRuleParameters)),
  scope: z.enum(['all', 'level', 'series']),
  scopeLevel: z.enum(seriesLevels).nullable(),
  scopeSeriesId: z.number().int().nullable(),
  hours: z.number().int(),
  threshold: z.number().nullable(),
  bandLevel: z.number().int().nullable(),
  floorKw: z.number().nullable(),
  peakHourTolerance: z.number().int().nullable(),
  severity: z.enum(missSeverities),
  recipients: z.array(z.string()),
  active: z.boolean(),
});

/** PATCH /api/miss-rules/:id: the parameters a person may change. */
export const missRuleUpdateSchema = z
  .object({
    hours: z.number().int().min(1).max(168),
    threshold: z.number().positive().nullable(),
    bandLevel: z.number().int().min(1).max(99).nullable(),
    floorKw: z.number().min(0).nullable(),
    peakHourTolerance: z.number().int().min(0).max(23).nullable(),
    severity: z.enum(missSeverities),
    recipients: z.array(recipientSchema).max(50),
    active: z.boolean(),
  })
  .partial()
  .refine((value) => Object.keys(value).length > 0, 'Send at least one field to change');

/** POST /api/miss-rules: a planner's override for a group (level) or one series. */
export const missRuleCreateSchema = z.object({
  kind: z.enum(missRuleKinds),
  scope: z.enum(['level', 'series']),
  scopeLevel: z.enum(seriesLevels).optional(),
  scopeSeriesId: recordIdSchema.optional(),
  hours: z.number().int().min(1).max(168).default(1),
  threshold: z.number().positive().nullable().default(null),
  bandLevel: z.number().int().min(1).max(99).nullable().default(null),
  floorKw: z.number().min(0).nullable().default(null),
  peakHourTolerance: z.number().int().min(0).max(23).nullable().default(null),
  severity: z.enum(missSeverities).default('medium'),
  recipients: z.array(recipientSchema).max(50).default([]),
  active: z.boolean().default(true),
});

/** GET /api/miss-rules/in-force: the rules of one series or of one group (level); exactly one of the two. */
export const missRulesInForceQuerySchema = z.object({
  series: idParamSchema.optional(),
  level: z.enum(seriesLevels).optional(),
});

/** Where the rule in force for a kind comes from. */
export const missRuleSources = ['default', 'level', 'series'] as const;

/** The rules in force for one series or group, kind by kind. */
export const missRulesInForceSchema = z.object({
  scope: z.enum(['level', 'series']),
  level: z.enum(seriesLevels).nullable(),
  series: z.object({ id: z.number().int(), key: z.string(), name: z.string(), unit: z.string() }).nullable(),
  kinds: z.array(
    z.object({
      kind: z.enum(missRuleKinds),
      kindName: z.string(),
      watches: z.string(),
      /** The rule that judges this kind here, or null when the kind is switched off here. */
      inForce: missRuleSchema.nullable(),
      /** Where the rule in force (or the switching off) comes from. */
      source: z.enum(missRuleSources),
      /** The override set for exactly this series or group, which a planner may change or remove. */
      override: missRuleSchema.nullable(),
    }),
  ),
});

const hhmm = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'A time as HH:MM, e.g. 07:00');

/** GET /api/settings: the organisation's settings (admins). */
export const organisationSettingsSchema = z.object({
  name: z.string(),
  timeZone: z.string(),
  refitHour: z.number().int().min(0).max(23),
  /** Local time by which each day's forecasts must be written. */
  forecastDeadline: hhmm,
  digestHour: z.number().int().min(0).max(23),
  mailFrom: z.string(),
  holidayCountry: z.string().nullable(),
  holidayRegion: z.string().nullable(),
});

/** PATCH /api/settings */
export const organisationSettingsUpdateSchema = z
  .object({
    timeZone: z.string().trim().min(1),
    refitHour: z.number().int().min(0, 'An hour from 0 to 23').max(23, 'An hour from 0 to 23'),
    forecastDeadline: hhmm,
    digestHour: z.number().int().min(0).max(23),
    mailFrom: z.string().trim().min(3).max(200),
  })
  .partial()
  .refine((value) => Object.keys(value).length > 0, 'Send at least one setting to change');

/** GET/PUT /api/account/miss-mail */
export const missMailChoiceSchema = z.object({ missMail: z.enum(missMailChoices) });

export type MissSummary = z.infer<typeof missSummarySchema>;
export type MissListQuery = z.input<typeof missListQuerySchema>;
export type MissDetail = z.infer<typeof missDetailSchema>;
export type MissOverview = z.infer<typeof missOverviewSchema>;
export type MissRule = z.infer<typeof missRuleSchema>;
export type MissRuleUpdate = z.infer<typeof missRuleUpdateSchema>;
export type MissRuleCreate = z.input<typeof missRuleCreateSchema>;
export type MissRulesInForce = z.infer<typeof missRulesInForceSchema>;
export type OrganisationSettings = z.infer<typeof organisationSettingsSchema>;
export type OrganisationSettingsUpdate = z.infer<typeof organisationSettingsUpdateSchema>;
export type MissMailChoice = z.infer<typeof missMailChoiceSchema>;
