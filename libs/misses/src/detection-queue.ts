/**
 * The detection queues: 'detect-misses' judges one series (added in the transaction that stores its
 * new actuals, at most one waiting per series), and 'detect-misses-hourly', fired by an hourly
 * schedule, fans out one 'detect-misses' job per watched series.
 */
import { enqueuePerSeries, ensurePerSeriesQueues, type Database } from '@loadwright/db';
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

/** Creates both queues, or brings their settings up to date. */
export async function createDetectionQueues(boss: PgBoss): Promise<void> {
  await ensurePerSeriesQueues(boss, detectMissesQueue, detectMissesHourlyQueue);
}

/** Adds a detection job per series on `db` (inside the caller's transaction when it is one). */
export async function enqueueDetection(db: Pick<Database, 'execute'>, seriesIds: readonly number[]): Promise<void> {
  await enqueuePerSeries(db, detectMissesQueue, seriesIds);
}
