/**
 * The scoring queues: 'score-accuracy' scores one series (added in the transaction that stores its new
 * actuals, at most one waiting per series), and 'score-accuracy-hourly', fired by an hourly schedule,
 * fans out one 'score-accuracy' job per load series, so versions written since and adjusted hours are
 * scored without new actuals.
 */
import { insertJobs, type Database } from '@loadwright/db';
import type PgBoss from 'pg-boss';

/** One series per job: data ScoreAccuracyJob. */
export const scoreAccuracyQueue = 'score-accuracy';
/** The hourly schedule fires into this queue. */
export const scoreAccuracyHourlyQueue = 'score-accuracy-hourly';
/** Minute past each hour at which the schedule fires (after miss detection's, so the two do not start together). */
export const scoringCron = '13 * * * *';

/** Data of a 'score-accuracy' job. */
export interface ScoreAccuracyJob {
  seriesId: number;
}

/** The 'short' policy keeps one waiting job per series key, so a burst of pushes is scored once; two retries. */
export const scoringQueueOptions = {
  policy: 'short',
  retryLimit: 2,
  retryDelay: 30,
  retryBackoff: true,
  expireInSeconds: 300,
} satisfies Omit<PgBoss.Queue, 'name'>;

/** Creates both queues, or brings their settings up to date. */
export async function createScoringQueues(boss: PgBoss): Promise<void> {
  for (const name of [scoreAccuracyQueue, scoreAccuracyHourlyQueue]) {
    const options = name === scoreAccuracyQueue ? scoringQueueOptions : { retryLimit: 1, retryDelay: 60, expireInSeconds: 300 };
    if (await boss.getQueue(name)) await boss.updateQueue(name, { name, ...options });
    else await boss.createQueue(name, { name, ...options });
  }
}

/** Adds a scoring job per series on `db` (inside the caller's transaction when it is one). */
export async function enqueueScoring(db: Pick<Database, 'execute'>, seriesIds: readonly number[]): Promise<void> {
  await insertJobs(
    db,
    [...new Set(seriesIds)].map((seriesId) => ({ name: scoreAccuracyQueue, data: { seriesId }, singletonKey: `series-${seriesId}` })),
  );
}
