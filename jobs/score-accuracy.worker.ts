/**
 * Accuracy scoring in the worker: 'score-accuracy' scores one series (jobs come from stored actuals and
 * from the hourly fan-out), and the hourly schedule's 'score-accuracy-hourly' job adds one per load
 * series, so new versions and adjusted hours are scored even when no actuals arrive. Scoring never runs
 * inside an import: the import only adds the job in its own transaction.
 */
import { createDb } from '@loadwright/db';
import {
  createScoringQueues,
  enqueueScoring,
  scorableSeries,
  scoreAccuracyHourlyQueue,
  scoreAccuracyQueue,
  scoreSeries,
  scoringCron,
  type ScoreAccuracyJob,
} from '@loadwright/accuracy';
import type PgBoss from 'pg-boss';
import type { QueueContext } from './queues';

/** Creates the queues and the hourly schedule and starts both handlers; its connections close when pg-boss stops. */
export async function registerScoringQueues(boss: PgBoss, context: QueueContext): Promise<void> {
  const { logger, presence } = context;
  const { db, close } = createDb(context.databaseUrl, { max: 2, applicationName: 'loadwright-accuracy' });
  boss.once('stopped', () => void close());
  await createScoringQueues(boss);
  await boss.schedule(scoreAccuracyHourlyQueue, scoringCron, {}, { tz: 'UTC' });
  await boss.work(scoreAccuracyHourlyQueue, async () => {
    const targets = await scorableSeries(db);
    await enqueueScoring(
      db,
      targets.map((target) => target.id),
    );
    logger.info({ series: targets.length }, 'hourly accuracy scoring queued');
  });
  await boss.work<ScoreAccuracyJob>(scoreAccuracyQueue, { batchSize: 1, pollingIntervalSeconds: 0.5 }, ([job]) =>
    job
      ? presence.hold([job.id], async () => {
          const outcome = await scoreSeries(db, job.data.seriesId);
          if (outcome.hours) logger.debug(outcome, 'accuracy scored');
        })
      : Promise.resolve(),
  );
}
