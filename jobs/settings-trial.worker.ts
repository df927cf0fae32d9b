/**
 * The 'settings-trial' handler: runs one trial per job (a trial is 28 refits, so one at a time per
 * worker; more workers run more trials side by side). A trial refused by its data ends its job
 * normally with the trial marked failed and why; any other error goes to pg-boss's retry.
 */
import pg from 'pg';
import type PgBoss from 'pg-boss';
import { createSettingsTrialQueue, runSettingsTrial, settingsTrialQueue, type SettingsTrialJob } from '@loadwright/refits';
import type { QueueContext } from './queues';

/** Creates the queue and starts its handler; its connections close when pg-boss stops. */
export async function registerSettingsTrialQueue(boss: PgBoss, context: QueueContext): Promise<void> {
  const { logger, presence } = context;
  const pool = new pg.Pool({
    connectionString: context.databaseUrl,
    max: 2,
    application_name: 'loadwright-settings-trial',
    idleTimeoutMillis: 5_000,
    connectionTimeoutMillis: 10_000,
    allowExitOnIdle: true,
  });
  pool.on('error', (error) => logger.warn({ err: error }, 'settings trial database connection lost'));
  boss.once('stopped', () => void pool.end().catch(() => {}));
  await createSettingsTrialQueue(boss);
  await boss.work<SettingsTrialJob>(
    settingsTrialQueue,
    { batchSize: 1, includeMetadata: true, pollingIntervalSeconds: 0.5 },
    ([job]) => job && presence.hold([job.id], () => runOne(job)),
  );

  async function runOne(job: PgBoss.JobWithMetadata<SettingsTrialJob>): Promise<void> {
    const { trialId } = job.data;
    try {
      const outcome = await runSettingsTrial(pool, trialId, { retryCount: job.retryCount, retryLimit: job.retryLimit });
      logger.info({ trialId, outcome }, 'settings trial ended');
    } catch (error) {
      logger.warn({ trialId, err: error, retryCount: job.retryCount }, 'settings trial failed; the queue retries it');
      throw error;
    }
  }
}
