/**
 * Closes settings trials that nobody will finish: a trial still queued or running whose job is gone
 * from the queue (its last attempt was handed back after its worker stopped) is marked failed with a
 * message the planner can act on, so the series can be tried again. Guarded by state, so two workers
 * sweeping at once change it once.
 */
import type pg from 'pg';
import { settingsTrialQueue } from '@loadwright/refits';

/** The message an interrupted trial ends with. */
export const interruptedTrialMessage = 'The trial was interrupted on every attempt (the worker running it stopped). Start it again.';

/** Marks orphaned trials failed; returns their ids. */
export async function sweepOrphanedTrials(pool: pg.Pool): Promise<number[]> {
  const { rows } = await pool.query<{ id: number }>(
    `update settings_trials t set state = 'failed', error = $2, finished_at = now()
      where t.state in ('queued', 'running') and t.created_at < now() - interval '1 minute'
        and not exists (select 1 from pgboss.job j where j.name = $1 and j.state < 'completed'
                          and j.data->>'trialId' = t.id::text)
      returning t.id`,
    [settingsTrialQueue, interruptedTrialMessage],
  );
  return rows.map((row) => row.id);
}
