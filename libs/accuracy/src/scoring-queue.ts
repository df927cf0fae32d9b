/**
 * The scoring queues: 'score-accuracy' scores one series (added in the transaction that stores its new
 * actuals, at most one waiting per series), and 'score-accuracy-hourly', fired by an hourly schedule,
 * fans out one 'score-accuracy' job per load series, so versions written since and adjusted hours are
 * scored without new actuals.
 */
import { enqueuePerSeries, ensurePerSeriesQueues, type Database } from '@loadwright/db';
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

/** Creates both queues, or brings their settings up to date. */
export async function createScoringQueues(boss: PgBoss): Promise<void> {
  await ensurePerSeriesQueues(boss, scoreAccuracyQueue, scoreAccuracyHourlyQueue);
}

/** Adds a scoring job per series on `db` (inside the caller's transaction when it is one). */
export async function enqueueScoring(db: Pick<Database, 'execute'>, seriesIds: readonly number[]): Promise<void> {
  await enqueuePerSeries(db, scoreAccuracyQueue, seriesIds);
}
