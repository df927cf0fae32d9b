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
} from 'drizzle-orm/pg-core';
import { forecastVersions } from './forecasts';
import { users } from './people';
import { series, seriesLevel } from './series';
import { createdAt, instant, updatedAt } from './timestamps';

/** What counts as a miss. */
export const missRuleKind = pgEnum('miss_rule_kind', ['outside_band', 'error_over_threshold', 'daily_peak_missed']);

/** Which series a rule watches: all load series, every series of one level, or one series. */
export const missRuleScope = pgEnum('miss_rule_scope', ['all', 'level', 'series']);

/** Where a detected miss stands. */
export const missState = pgEnum('miss_state', ['open', 'acknowledged', 'resolved']);

/**
 * A rule checking approved forecasts against actuals as they arrive. `band_level` is the interval
 * level (percent) for `outside_band`; `threshold` is the percentage error for
 * `error_over_threshold` and the peak error for `daily_peak_missed`.
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
    recipients: text('recipients')
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    active: boolean('active').notNull().default(true),
    createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    index('miss_rules_scope_series_idx').on(t.scopeSeriesId),
    check(
      'miss_rules_scope_check',
      sql`(${t.scope} = 'all' and ${t.scopeLevel} is null and ${t.scopeSeriesId} is null)
       or (${t.scope} = 'level' and ${t.scopeLevel} is not null and ${t.scopeSeriesId} is null)
       or (${t.scope} = 'series' and ${t.scopeSeriesId} is not null and ${t.scopeLevel} is null)`,
    ),
    check(
      'miss_rules_parameters_check',
      sql`(${t.kind} = 'outside_band' and ${t.bandLevel} between 1 and 99)
       or (${t.kind} <> 'outside_band' and ${t.threshold} > 0)`,
    ),
  ],
);

/**
 * One miss found by a rule for one series and forecast version over one period. Re-evaluating the
 * same actuals finds the same (rule, series, version, period start) and adds nothing.
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
    versionId: bigint('version_id', { mode: 'number' })
      .notNull()
      .references(() => forecastVersions.id, { onDelete: 'cascade' }),
    periodStart: instant('period_start').notNull(),
    periodEnd: instant('period_end').notNull(),
    detectedAt: instant('detected_at').notNull().defaultNow(),
    state: missState('state').notNull().default('open'),
    /** Actual, forecast, bound or error that made this a miss. */
    detail: jsonb('detail').$type<Record<string, unknown>>().notNull().default({}),
    notifiedAt: instant('notified_at'),
    acknowledgedById: integer('acknowledged_by_id').references(() => users.id, { onDelete: 'set null' }),
    acknowledgedAt: instant('acknowledged_at'),
    resolvedById: integer('resolved_by_id').references(() => users.id, { onDelete: 'set null' }),
    resolvedAt: instant('resolved_at'),
  },
  (t) => [
    unique('miss_events_rule_series_version_period_key').on(t.ruleId, t.seriesId, t.versionId, t.periodStart),
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
