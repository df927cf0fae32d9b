import { sql } from 'drizzle-orm';
import {
  bigint,
  boolean,
  check,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  smallint,
  text,
  unique,
  uniqueIndex,
} from 'drizzle-orm/pg-core';
import { forecastVersions } from './forecasts';
import { users } from './people';
import { series, seriesLevel } from './series';
import { createdAt, instant, updatedAt } from './timestamps';

/**
 * What counts as a miss: actual outside the band, percentage error over a threshold, the day's peak
 * (size or hour) missed, errors piling up on one side (creeping bias, by the tracking signal), and the
 * operational ones: actuals arriving late, no forecast by the morning deadline, too many estimated
 * hours in a day.
 */
export const missRuleKind = pgEnum('miss_rule_kind', [
  'outside_band',
  'error_over_threshold',
  'daily_peak_missed',
  'creeping_bias',
  'actuals_late',
  'forecast_late',
  'estimated_hours',
]);

/** How urgent a miss is: high is e-mailed at once, the others in the daily digest (unless a person chooses otherwise). */
export const missSeverity = pgEnum('miss_severity', ['low', 'medium', 'high']);

/** Which series a rule watches: all load series, every series of one level, or one series. */
export const missRuleScope = pgEnum('miss_rule_scope', ['all', 'level', 'series']);

/** Where a detected miss stands. */
export const missState = pgEnum('miss_state', ['open', 'acknowledged', 'resolved']);

/**
 * A rule checking the forecast in force against actuals as they arrive. Rules of scope `all` are the
 * admin's defaults; a rule of the same kind scoped to a level or a series replaces the default there
 * (the most specific wins, and an inactive override switches the kind off for its scope).
 * `band_level` is the interval level (percent) for `outside_band`; `threshold` is the percentage
 * error for `error_over_threshold`, the peak error (percent) for `daily_peak_missed`, the tracking
 * signal limit for `creeping_bias`, hours without actuals for `actuals_late`, and estimated hours in a
 * day for `estimated_hours`. `hours` is how many consecutive hours must break the rule. A target (a
 * level or a series) has at most one override of a kind that has not been removed.
 */
export const missRules = pgTable(
  'miss_rules',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    name: text('name').notNull(),
    scope: missRuleScope('scope').notNull().default('all'),
    scopeLevel: seriesLevel('scope_level'),
    scopeSeriesId: integer('scope_series_id').references(() => series.id, { onDelete: 'cascade' }),
    kind: missRuleKind('kind').notNull(),
    bandLevel: smallint('band_level'),
    threshold: doublePrecision('threshold'),
    /** Consecutive hours that must break the rule before it is a miss (k). */
    hours: smallint('hours').notNull().default(1),
    /** Percentage rules ignore hours whose actual and forecast are both below this load, in kW. */
    floorKw: doublePrecision('floor_kw'),
    /** For `daily_peak_missed`: hours the peak's time may be off before it counts. */
    peakHourTolerance: smallint('peak_hour_tolerance'),
    severity: missSeverity('severity').notNull().default('medium'),
    recipients: text('recipients')
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    active: boolean('active').notNull().default(true),
    /** When a planner removed this override: it no longer applies, and the misses it found keep their rule. */
    removedAt: instant('removed_at'),
    createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    index('miss_rules_scope_series_idx').on(t.scopeSeriesId),
    uniqueIndex('miss_rules_one_level_override_key')
      .on(t.kind, t.scopeLevel)
      .where(sql`${t.scope} = 'level' and ${t.removedAt} is null`),
    uniqueIndex('miss_rules_one_series_override_key')
      .on(t.kind, t.scopeSeriesId)
      .where(sql`${t.scope} = 'series' and ${t.removedAt} is null`),
    check(
      'miss_rules_scope_check',
      sql`(${t.scope} = 'all' and ${t.scopeLevel} is null and ${t.scopeSeriesId} is null)
       or (${t.scope} = 'level' and ${t.scopeLevel} is not null and ${t.scopeSeriesId} is null)
       or (${t.scope} = 'series' and ${t.scopeSeriesId} is not null and ${t.scopeLevel} is null)`,
    ),
    check(
      'miss_rules_parameters_check',
      sql`(${t.bandLevel} is null or ${t.bandLevel} between 1 and 99) and (${t.threshold} is null or ${t.threshold} > 0)
       and ${t.hours} between 1 and 168 and (${t.floorKw} is null or ${t.floorKw} >= 0)
       and (${t.peakHourTolerance} is null or ${t.peakHourTolerance} between 0 and 23)`,
    ),
  ],
);

/**
 * One miss found by a rule for one series over one period. A rule and series have at most one open
 * event: new hits extend it; hours already covered by any event add nothing, so re-evaluating the
 * same actuals never duplicates. `detail` keeps the evidence (each hour's actual, forecast, band,
 * error and version); `cause` says why it missed once that can be told.
 */
export const missEvents = pgTable(
  'miss_events',
  {
    id: bigint('id', { mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
    ruleId: integer('rule_id')
      .notNull()
      .references(() => missRules.id, { onDelete: 'cascade' }),
    seriesId: integer('series_id')
      .notNull()
      .references(() => series.id, { onDelete: 'cascade' }),
    /** The version in force for the first missed hour (none for a forecast that never came). */
    versionId: bigint('version_id', { mode: 'number' }).references(() => forecastVersions.id, { onDelete: 'cascade' }),
    severity: missSeverity('severity').notNull().default('medium'),
    periodStart: instant('period_start').notNull(),
    periodEnd: instant('period_end').notNull(),
    detectedAt: instant('detected_at').notNull().defaultNow(),
    state: missState('state').notNull().default('open'),
    /** Actual, forecast, bound or error that made this a miss. */
    detail: jsonb('detail').$type<Record<string, unknown>>().notNull().default({}),
    /** Why it missed: the temperature and model parts of the error and the flags found. */
    cause: jsonb('cause').$type<Record<string, unknown>>(),
    notifiedAt: instant('notified_at'),
    acknowledgedById: integer('acknowledged_by_id').references(() => users.id, { onDelete: 'set null' }),
    acknowledgedAt: instant('acknowledged_at'),
    resolvedById: integer('resolved_by_id').references(() => users.id, { onDelete: 'set null' }),
    resolvedAt: instant('resolved_at'),
  },
  (t) => [
    unique('miss_events_rule_series_version_period_key').on(t.ruleId, t.seriesId, t.versionId, t.periodStart),
    uniqueIndex('miss_events_one_open_key')
      .on(t.ruleId, t.seriesId)
      .where(sql`${t.state} = 'open'`),
    index('miss_events_state_detected_idx').on(t.state, t.detectedAt.desc()),
    index('miss_events_series_detected_idx').on(t.seriesId, t.detectedAt.desc()),
    index('miss_events_version_idx').on(t.versionId),
    check('miss_events_period_check', sql`${t.periodEnd} > ${t.periodStart}`),
    check('miss_events_acknowledged_check', sql`${t.state} = 'open' or ${t.acknowledgedAt} is not null or ${t.resolvedAt} is not null`),
  ],
);

/** A note left on a miss by the people handling it. */
export const missComments = pgTable(
  'miss_comments',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    eventId: bigint('event_id', { mode: 'number' })
      .notNull()
      .references(() => missEvents.id, { onDelete: 'cascade' }),
    authorId: integer('author_id').references(() => users.id, { onDelete: 'set null' }),
    body: text('body').notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    index('miss_comments_event_idx').on(t.eventId, t.createdAt),
    check('miss_comments_body_check', sql`length(btrim(${t.body})) > 0`),
  ],
);
