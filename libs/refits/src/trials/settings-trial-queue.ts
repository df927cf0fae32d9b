/** The settings-trial job queue: its name, its job's data and its retry settings, shared by the API and the worker. */
import { ensureQueue } from '@loadwright/db';
import type PgBoss from 'pg-boss';

/** One job per trial: data SettingsTrialJob. */
export const settingsTrialQueue = 'settings-trial';

/** Data of a 'settings-trial' job. */
export interface SettingsTrialJob {
  trialId: number;
}

/**
 * One retry after 15 s: a trial fails for good on bad data at once (see runSettingsTrial), so a retry
 * only covers a lost connection or a killed worker (handed back by the worker heartbeat). Expiry is the
 * backstop for a trial that hangs: 28 refits of a ten-year window stay well under half an hour.
 */
export const settingsTrialQueueOptions: Omit<PgBoss.Queue, 'name'> = {
  retryLimit: 1,
  retryDelay: 15,
  retryBackoff: false,
  expireInSeconds: 1_800,
};

/** Creates the queue (or brings its settings up to date). */
export async function createSettingsTrialQueue(boss: PgBoss): Promise<void> {
  await ensureQueue(boss, settingsTrialQueue, settingsTrialQueueOptions);
}

/** True when the queue exists (a worker has started at least once against this database). */
export async function settingsTrialQueueReady(db: {
  query(text: string, values?: unknown[]): Promise<{ rows: unknown[] }>;
}): Promise<boolean> {
  const { rows } = await db.query(`select to_regclass('pgboss.queue') is not null as installed`);
  if (!(rows[0] as { installed: boolean }).installed) return false;
  return (await db.query('select 1 from pgboss.queue where name = $1', [settingsTrialQueue])).rows.length > 0;
}
