/**
 * The detection queues: 'detect-misses' judges one series (added in the transaction that stores its
 * new actuals, at most one waiting per series), and 'detect-misses-hourly', fired by an hourly
 * schedule, fans out one 'detect-misses' job per watched series.
 */
import { insertJobs, type Database } from '@loadwright/db';
import type PgBoss from 'pg-boss';

/** One series per job: data DetectMissesJob. */
export const detectMissesQueue = 'detect-misses';
/** The hourly schedule fires into this queue. */
export const detectMissesHourlyQueue = 'detect-misses-hourly';
/** Minute past each hour at which the schedule fires (after most hourly pushes have landed). */
export const detectionCron = '7 * * * *';

/** Data of a 'detect-misses' job. */
export interface DetectMissesJob {
  seriesId: number;
}

/**
 * Queue settings. The 'short' policy keeps one waiting job per series key, so a burst of pushes for a
 * series is judged once; two retries 30 s apart and doubling.
 */
export const detectionQueueOptions = {
  policy: 'short',
  retryLimit: 2,
  retryDelay: 30,
  retryBackoff: true,
  expireInSeconds: 300,
} satisfies Omit<PgBoss.Queue, 'name'>;

/** Creates both queues, or brings their settings up to date. */
export async function createDetectionQueues(boss: PgBoss): Promise<void> {
  for (const name of [detectMissesQueue, detectMissesHourlyQueue]) {
    const options = name === detectMissesQueue ? detectionQueueOptions : { retryLimit: 1, retryDelay: 60, expireInSeconds: 300 };
    if (await boss.getQueue(name)) await boss.updateQueue(name, { name, ...options });
    else await boss.createQueue(name, { name, ...options });
  }
}

/** Adds a detection job per series on `db` (inside the caller's transaction when it is one). */
export async function enqueueDetection(db: Pick<Database, 'execute'>, seriesIds: readonly number[]): Promise<void> {
  await insertJobs(
    db,
    [...new Set(seriesIds)].map((seriesId) => ({ name: detectMissesQueue, data: { seriesId }, singletonKey: `series-${seriesId}` })),
  );
}
