import { sql } from 'drizzle-orm';
import { bigint, check, doublePrecision, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, uniqueIndex } from 'drizzle-orm/pg-core';
import { fits } from './models';
import { users } from './people';
import { refitRuns } from './refits';
import { series } from './series';
import { createdAt, instant } from './timestamps';

/** Life of a forecast version: drafted by a refit, approved by a planner, then superseded. */
export const forecastState = pgEnum('forecast_state', ['draft', 'approved', 'superseded']);

/**
 * Which kind of prediction band a version carries: `empirical` (calibrated on the series' own
 * out-of-sample errors, split conformal by horizon band and hour of day) or `gaussian` (ψ-weight
 * standard errors: short histories, seasonal naive, and every version made before calibration existed).
 */
export const forecastBandKind = pgEnum('forecast_band_kind', ['empirical', 'gaussian']);

/** How a version's bands were made (see forecastBandKind). */
export interface ForecastBandsNote {
  scale: 'load' | 'log';
  origins: number;
  scores: number;
  reason: string;
}

/** Something the planner should know about how a version was made (e.g. temperature fallback). */
export interface ForecastWarning {
  code: string;
  message: string;
}

/**
 * One issued forecast of one series. Partial unique indexes allow at most one draft and one
 * approved version per series, and one version per series per refit run (idempotent jobs).
 */
export const forecastVersions = pgTable(
  'forecast_versions',
  {
    id: bigint('id', { mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
    seriesId: integer('series_id')
      .notNull()
      .references(() => series.id, { onDelete: 'cascade' }),
    fitId: bigint('fit_id', { mode: 'number' })
      .notNull()
      .references(() => fits.id, { onDelete: 'restrict' }),
    refitRunId: integer('refit_run_id').references(() => refitRuns.id, { onDelete: 'set null' }),
    state: forecastState('state').notNull().default('draft'),
    issuedAt: instant('issued_at').notNull().defaultNow(),
    /** First forecast instant (the hour after the last actual used). */
    origin: instant('origin').notNull(),
    horizonHours: integer('horizon_hours').notNull(),
    levels: integer('levels')
      .array()
      .notNull()
      .default(sql`'{80,95}'::integer[]`),
    warnings: jsonb('warnings').$type<ForecastWarning[]>().notNull().default([]),
    bandKind: forecastBandKind('band_kind').notNull().default('gaussian'),
    bands: jsonb('bands').$type<ForecastBandsNote>(),
    approvedById: integer('approved_by_id').references(() => users.id, { onDelete: 'set null' }),
    approvedAt: instant('approved_at'),
    supersededAt: instant('superseded_at'),
  },
  (t) => [
    uniqueIndex('forecast_versions_one_draft_key')
      .on(t.seriesId)
      .where(sql`${t.state} = 'draft'`),
    uniqueIndex('forecast_versions_one_approved_key')
      .on(t.seriesId)
      .where(sql`${t.state} = 'approved'`),
    uniqueIndex('forecast_versions_run_series_key')
      .on(t.refitRunId, t.seriesId)
      .where(sql`${t.refitRunId} is not null`),
    index('forecast_versions_series_issued_idx').on(t.seriesId, t.issuedAt.desc()),
    check('forecast_versions_approval_check', sql`${t.state} <> 'approved' or ${t.approvedAt} is not null`),
    check('forecast_versions_superseded_check', sql`(${t.state} = 'superseded') = (${t.supersededAt} is not null)`),
    check('forecast_versions_horizon_check', sql`${t.horizonHours} > 0`),
  ],
);

/**
 * One forecast instant of a version: the mean, its standard error and the 80 % and 95 % bounds as
 * columns, so the 168 rows of a week read in one index range scan with no JSON decoding. Other
 * levels follow from mean and standard error.
 */
export const forecastPoints = pgTable(
  'forecast_points',
  {
    versionId: bigint('version_id', { mode: 'number' })
      .notNull()
      .references(() => forecastVersions.id, { onDelete: 'cascade' }),
    ts: instant('ts').notNull(),
    mean: doublePrecision('mean').notNull(),
    stdError: doublePrecision('std_error').notNull(),
    lower80: doublePrecision('lower_80').notNull(),
    upper80: doublePrecision('upper_80').notNull(),
    lower95: doublePrecision('lower_95').notNull(),
    upper95: doublePrecision('upper_95').notNull(),
  },
  (t) => [
    primaryKey({ name: 'forecast_points_pkey', columns: [t.versionId, t.ts] }),
    check(
      'forecast_points_bounds_check',
      sql`${t.lower95} <= ${t.lower80} and ${t.lower80} <= ${t.upper80} and ${t.upper80} <= ${t.upper95}`,
    ),
  ],
);

/** How an adjustment changes the model's numbers over its period. */
export const adjustmentKind = pgEnum('adjustment_kind', ['shift', 'scale']);

/**
 * A planner's change to a period of a version, kept beside the model's numbers: `shift` adds
 * `amount` (in the series' unit), `scale` multiplies by `amount`.
 */
export const forecastAdjustments = pgTable(
  'forecast_adjustments',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    versionId: bigint('version_id', { mode: 'number' })
      .notNull()
      .references(() => forecastVersions.id, { onDelete: 'cascade' }),
    periodStart: instant('period_start').notNull(),
    periodEnd: instant('period_end').notNull(),
    kind: adjustmentKind('kind').notNull(),
    amount: doublePrecision('amount').notNull(),
    reason: text('reason').notNull(),
    createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [
    index('forecast_adjustments_version_idx').on(t.versionId, t.periodStart),
    check('forecast_adjustments_period_check', sql`${t.periodEnd} > ${t.periodStart}`),
    check('forecast_adjustments_scale_check', sql`${t.kind} <> 'scale' or ${t.amount} > 0`),
    check('forecast_adjustments_reason_check', sql`length(btrim(${t.reason})) > 0`),
  ],
);
