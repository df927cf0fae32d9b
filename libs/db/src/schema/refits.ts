import { sql } from 'drizzle-orm';
import { bigint, check, index, integer, jsonb, pgEnum, pgTable, primaryKey, smallint, text, uniqueIndex } from 'drizzle-orm/pg-core';
import { fits } from './models';
import { users } from './people';
import { series } from './series';
import { createdAt, instant } from './timestamps';

/** What started a refit run. */
export const refitTrigger = pgEnum('refit_trigger', ['schedule', 'manual']);

/** Where one series stands within a refit run. */
export const refitStatus = pgEnum('refit_status', ['queued', 'running', 'done', 'failed']);

/** Which series a run covers: all active ones, one group (a hierarchy node and its subtree), or a list. */
export type RefitScope = { kind: 'all' } | { kind: 'subtree'; seriesId: number } | { kind: 'series'; seriesIds: number[] };

/**
 * One nightly or manual refit across a set of series. A scheduled run is unique per scheduled
 * instant, so a schedule fired twice starts one run.
 */
export const refitRuns = pgTable(
  'refit_runs',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    trigger: refitTrigger('trigger').notNull(),
    requestedById: integer('requested_by_id').references(() => users.id, { onDelete: 'set null' }),
    scope: jsonb('scope').$type<RefitScope>().notNull().default({ kind: 'all' }),
    /** The schedule's fire time (scheduled runs only). */
    scheduledFor: instant('scheduled_for'),
    seriesTotal: integer('series_total').notNull().default(0),
    seriesDone: integer('series_done').notNull().default(0),
    seriesFailed: integer('series_failed').notNull().default(0),
    createdAt: createdAt(),
    startedAt: instant('started_at'),
    finishedAt: instant('finished_at'),
  },
  (t) => [
    uniqueIndex('refit_runs_scheduled_for_key')
      .on(t.scheduledFor)
      .where(sql`${t.trigger} = 'schedule'`),
    index('refit_runs_created_at_idx').on(t.createdAt.desc()),
    check('refit_runs_schedule_has_time_check', sql`${t.trigger} <> 'schedule' or ${t.scheduledFor} is not null`),
  ],
);

/** Time spent in each phase of one series' refit, in milliseconds. */
export interface RefitPhaseTimings {
  read?: number;
  fit?: number;
  diagnose?: number;
  forecast?: number;
  write?: number;
}

/** Progress of one series within one run: status, attempts, error and timings. */
export const refitRunSeries = pgTable(
  'refit_run_series',
  {
    runId: integer('run_id')
      .notNull()
      .references(() => refitRuns.id, { onDelete: 'cascade' }),
    seriesId: integer('series_id')
      .notNull()
      .references(() => series.id, { onDelete: 'cascade' }),
    status: refitStatus('status').notNull().default('queued'),
    attempts: smallint('attempts').notNull().default(0),
    error: text('error'),
    fitId: bigint('fit_id', { mode: 'number' }).references(() => fits.id, { onDelete: 'set null' }),
    phaseMs: jsonb('phase_ms').$type<RefitPhaseTimings>(),
    queuedAt: instant('queued_at').notNull().defaultNow(),
    startedAt: instant('started_at'),
    finishedAt: instant('finished_at'),
    durationMs: integer('duration_ms'),
  },
  (t) => [
    primaryKey({ name: 'refit_run_series_pkey', columns: [t.runId, t.seriesId] }),
    index('refit_run_series_run_status_idx').on(t.runId, t.status),
    index('refit_run_series_series_idx').on(t.seriesId, t.runId.desc()),
  ],
);
