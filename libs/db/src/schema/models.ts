import { sql } from 'drizzle-orm';
import { bigint, boolean, check, doublePrecision, index, integer, jsonb, pgEnum, pgTable, smallint, text } from 'drizzle-orm/pg-core';
import { users } from './people';
import { series } from './series';
import { createdAt, instant, updatedAt } from './timestamps';

/** Estimation methods a series may be set to; `auto` compares candidates and picks one. */
export const modelMethod = pgEnum('model_method', [
  'auto',
  'yule_walker',
  'conditional_mle',
  'nls_arma',
  'ridge_ar',
  'lasso_ar',
  'seasonal_naive',
]);

/** How the weekly and daily shape of load is handled before the AR/ARMA part. */
export const seasonalTreatment = pgEnum('seasonal_treatment', [
  'none',
  'hour_of_week_profile',
  'seasonal_difference',
  'hour_of_day_profile',
]);

/** Whether a seasonal profile adds to the level or scales it. */
export const profileForm = pgEnum('profile_form', ['additive', 'multiplicative']);

/** Model settings of one series, as the planner left them. */
export const modelSpecs = pgTable(
  'model_specs',
  {
    seriesId: integer('series_id')
      .primaryKey()
      .references(() => series.id, { onDelete: 'cascade' }),
    method: modelMethod('method').notNull().default('auto'),
    /** Fixed AR order; null lets the method choose up to `max_ar_order`. */
    arOrder: smallint('ar_order'),
    /** Fixed MA order (ARMA only); null lets the method choose up to `max_ma_order`. */
    maOrder: smallint('ma_order'),
    maxArOrder: smallint('max_ar_order').notNull().default(48),
    maxMaOrder: smallint('max_ma_order').notNull().default(2),
    /** Extra lags offered to ridge/lasso beyond 1..max_ar_order, e.g. 168 for last week. */
    extraLags: integer('extra_lags')
      .array()
      .notNull()
      .default(sql`'{}'::integer[]`),
    seasonalTreatment: seasonalTreatment('seasonal_treatment').notNull().default('hour_of_week_profile'),
    /** Form of the hour-of-week or hour-of-day profile. */
    profileForm: profileForm('profile_form').notNull().default('additive'),
    /** Lag of seasonal differencing (24 or 168 hours), used when the treatment is `seasonal_difference`. */
    differenceLag: smallint('difference_lag').notNull().default(168),
    /** Model log(load) instead of load. */
    logTransform: boolean('log_transform').notNull().default(false),
    /** Heating balance point in the temperature series' unit; null takes 15.5 °C (60 °F). */
    heatingBase: doublePrecision('heating_base'),
    /** Cooling balance point in the temperature series' unit; null takes 22 °C (72 °F). */
    coolingBase: doublePrecision('cooling_base'),
    useTemperature: boolean('use_temperature').notNull().default(true),
    useDayType: boolean('use_day_type').notNull().default(true),
    trainingWindowDays: integer('training_window_days').notNull().default(365),
    horizonHours: integer('horizon_hours').notNull().default(168),
    levels: integer('levels')
      .array()
      .notNull()
      .default(sql`'{80,95}'::integer[]`),
    updatedById: integer('updated_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    check(
      'model_specs_orders_check',
      sql`coalesce(${t.arOrder}, 0) >= 0 and coalesce(${t.maOrder}, 0) >= 0 and ${t.maxArOrder} >= 0 and ${t.maxMaOrder} >= 0`,
    ),
    check('model_specs_difference_lag_check', sql`${t.differenceLag} in (24, 168)`),
    check(
      'model_specs_balance_points_check',
      sql`${t.heatingBase} is null or ${t.coolingBase} is null or ${t.heatingBase} <= ${t.coolingBase}`,
    ),
    check('model_specs_horizon_check', sql`${t.horizonHours} between 1 and 8784`),
    check('model_specs_training_window_check', sql`${t.trainingWindowDays} between 7 and 3660`),
    check('model_specs_levels_check', sql`cardinality(${t.levels}) >= 1 and 0 < all(${t.levels}) and 100 > all(${t.levels})`),
  ],
);

/** The settings a fit was made with, frozen at fit time (shape owned by the contracts). */
export type ModelSpecSnapshot = Record<string, unknown>;

/**
 * One estimated model of one series: what was fitted to which data, its coefficients with standard
 * errors, information criteria and diagnostics.
 */
export const fits = pgTable(
  'fits',
  {
    id: bigint('id', { mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
    seriesId: integer('series_id')
      .notNull()
      .references(() => series.id, { onDelete: 'cascade' }),
    specSnapshot: jsonb('spec_snapshot').$type<ModelSpecSnapshot>().notNull(),
    /** The method that produced this fit (never `auto`: auto records its choice here). */
    method: modelMethod('method').notNull(),
    arOrder: smallint('ar_order').notNull().default(0),
    maOrder: smallint('ma_order').notNull().default(0),
    /** Named coefficients, e.g. {"ar": [...], "ma": [...], "intercept": 0, "temperature": {...}}. */
    parameters: jsonb('parameters').$type<Record<string, unknown>>().notNull(),
    standardErrors: jsonb('standard_errors').$type<Record<string, unknown>>(),
    sigma2: doublePrecision('sigma2'),
    logLikelihood: doublePrecision('log_likelihood'),
    aic: doublePrecision('aic'),
    aicc: doublePrecision('aicc'),
    bic: doublePrecision('bic'),
    /** Residual ACF, Ljung-Box statistic and p-value, backtest scores. */
    diagnostics: jsonb('diagnostics').$type<Record<string, unknown>>().notNull().default({}),
    /** For `auto`: the candidates compared and why this one won. */
    selection: jsonb('selection').$type<Record<string, unknown>>(),
    dataStart: instant('data_start').notNull(),
    dataEnd: instant('data_end').notNull(),
    observationCount: integer('observation_count').notNull(),
    /** SHA-256 over the training data as used, so an unchanged window can be recognised. */
    dataHash: text('data_hash').notNull(),
    durationMs: integer('duration_ms').notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    index('fits_series_created_idx').on(t.seriesId, t.createdAt.desc()),
    check('fits_window_check', sql`${t.dataEnd} >= ${t.dataStart}`),
  ],
);
