import type { ModelSettingsRequest, TrialResults } from '@loadwright/contracts';
import { sql } from 'drizzle-orm';
import { check, index, integer, jsonb, pgTable, text, uniqueIndex } from 'drizzle-orm/pg-core';
import { users } from './people';
import { series } from './series';
import { createdAt, instant } from './timestamps';

/**
 * A planner's settings trial: proposed model settings backtested against the series' settings in force,
 * from the same rolling origins, by the 'settings-trial' job. Kept after it ends (and after it is
 * applied) so the next planner sees what was tried and how it scored.
 */
export const settingsTrials = pgTable(
  'settings_trials',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    seriesId: integer('series_id')
      .notNull()
      .references(() => series.id, { onDelete: 'cascade' }),
    state: text('state').notNull().default('queued'),
    /** The settings in force when the trial was started (the baseline) and the proposal. */
    currentSettings: jsonb('current_settings').$type<ModelSettingsRequest>().notNull(),
    proposedSettings: jsonb('proposed_settings').$type<ModelSettingsRequest>().notNull(),
    /** Refits done and needed (two sides × origins): the progress bar. */
    fitsDone: integer('fits_done').notNull().default(0),
    fitsTotal: integer('fits_total').notNull(),
    firstOrigin: instant('first_origin'),
    lastOrigin: instant('last_origin'),
    results: jsonb('results').$type<TrialResults>(),
    /** Why the trial failed, in words. */
    error: text('error'),
    requestedById: integer('requested_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    startedAt: instant('started_at'),
    finishedAt: instant('finished_at'),
    appliedAt: instant('applied_at'),
    appliedById: integer('applied_by_id').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [
    index('settings_trials_series_idx').on(t.seriesId, t.createdAt.desc()),
    // One trial at a time per series: a second start while one is queued or running is refused.
    uniqueIndex('settings_trials_one_active_key')
      .on(t.seriesId)
      .where(sql`${t.state} in ('queued', 'running')`),
    check('settings_trials_state_check', sql`${t.state} in ('queued', 'running', 'finished', 'failed')`),
    check('settings_trials_results_check', sql`${t.state} <> 'finished' or ${t.results} is not null`),
    check('settings_trials_applied_check', sql`${t.appliedAt} is null or ${t.state} = 'finished'`),
  ],
);
