/**
 * pg-boss queues as the product declares them: created on a worker's start, or brought up to date when
 * their settings changed since; and the per-series pattern (one waiting job per series, added in the
 * transaction that stored the series' new rows, plus an hourly queue whose job fans out over series).
 */
import type PgBoss from 'pg-boss';
import type { Database } from './client';
import { insertJobs } from './job-insert';

export type QueueOptions = Omit<PgBoss.Queue, 'name'>;

/** Creates queue `name` with `options`, or updates its settings when it exists. */
export async function ensureQueue(boss: PgBoss, name: string, options: QueueOptions): Promise<void> {
  if (await boss.getQueue(name)) await boss.updateQueue(name, { name, ...options });
  else await boss.createQueue(name, { name, ...options });
}

/** The 'short' policy keeps one waiting job per series key, so a burst of pushes is handled once; two retries 30 s apart, doubling. */
export const perSeriesQueueOptions = {
  policy: 'short',
  retryLimit: 2,
  retryDelay: 30,
  retryBackoff: true,
  expireInSeconds: 300,
} satisfies QueueOptions;

/** The queue an hourly schedule fires into; its one job fans out per-series jobs. */
const hourlyFanOutOptions = { retryLimit: 1, retryDelay: 60, expireInSeconds: 300 } satisfies QueueOptions;

/** Creates (or updates) a per-series queue and the hourly queue that fans out over it. */
export async function ensurePerSeriesQueues(boss: PgBoss, queue: string, hourlyQueue: string): Promise<void> {
  await ensureQueue(boss, queue, perSeriesQueueOptions);
  await ensureQueue(boss, hourlyQueue, hourlyFanOutOptions);
}

/** Adds one job per distinct series to `queue` on `db` (inside the caller's transaction when it is one). */
export async function enqueuePerSeries(db: Pick<Database, 'execute'>, queue: string, seriesIds: readonly number[]): Promise<void> {
  await insertJobs(
    db,
    [...new Set(seriesIds)].map((seriesId) => ({ name: queue, data: { seriesId }, singletonKey: `series-${seriesId}` })),
  );
}
