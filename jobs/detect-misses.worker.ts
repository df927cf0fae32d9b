/**
 * Miss detection in the worker: 'detect-misses' judges one series (jobs come from stored actuals and
 * from the hourly fan-out), and the hourly schedule's 'detect-misses-hourly' job adds one per watched
 * series, so operational misses (late actuals, no forecast by the deadline) are found with no new data;
 * in the organisation's digest hour it also queues the daily digest of misses.
 */
import { createDb } from '@loadwright/db';
import {
  createDetectionQueues,
  detectionCron,
  detectMisses,
  detectMissesHourlyQueue,
  detectMissesQueue,
  enqueueDetection,
  ensureDefaultRules,
  isDigestHour,
  sendMissDigest,
  watchedSeries,
  type DetectMissesJob,
} from '@loadwright/misses';
import type PgBoss from 'pg-boss';
import type { Logger } from 'pino';

/** What detection needs from the worker. */
export interface DetectionWorkerContext {
  logger: Logger;
  databaseUrl: string;
  /** The address people open, for links in e-mail. */
  publicUrl: string;
}

/** Creates the queues and the hourly schedule, writes default rules where none exist, and starts both handlers. */
export async function registerDetectionQueues(boss: PgBoss, context: DetectionWorkerContext): Promise<void> {
  const { logger } = context;
  const { db, close } = createDb(context.databaseUrl, { max: 3, applicationName: 'loadwright-misses' });
  boss.once('stopped', () => void close());
  await createDetectionQueues(boss);
  await ensureDefaultRules(db);
  await boss.schedule(detectMissesHourlyQueue, detectionCron, {}, { tz: 'UTC' });
  await boss.work(detectMissesHourlyQueue, async () => {
    const now = new Date();
    if (await isDigestHour(db, now)) logger.info({ digests: await sendMissDigest(db, now, context.publicUrl) }, 'daily miss digest queued');
    const watched = await watchedSeries(db);
    await enqueueDetection(
      db,
      watched.map((s) => s.id),
    );
    logger.info({ series: watched.length }, 'hourly miss detection queued');
  });
  await boss.work<DetectMissesJob>(detectMissesQueue, { batchSize: 2, pollingIntervalSeconds: 0.5 }, async (jobs) => {
    const results = await Promise.allSettled(
      jobs.map((job) => detectMisses(db, job.data.seriesId, new Date(), { publicUrl: context.publicUrl })),
    );
    for (const [i, result] of results.entries()) {
      const job = jobs[i]!;
      if (result.status === 'fulfilled') {
        const { opened, extended } = result.value;
        if (opened.length || extended.length) logger.info(result.value, 'misses detected');
        continue;
      }
      logger.warn({ seriesId: job.data.seriesId, err: result.reason }, 'miss detection failed; the queue retries it');
      await boss.fail(detectMissesQueue, job.id, {
        message: result.reason instanceof Error ? result.reason.message : String(result.reason),
      });
    }
  });
}
