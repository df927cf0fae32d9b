/**
 * The refit's job queues: names, retry settings, and a way to add jobs inside one's own transaction
 * (pg-boss's insert on the caller's connection), shared by the API and the worker.
 */
import { ensureQueue } from '@loadwright/db';
import PgBoss from 'pg-boss';
import type { Queryable } from './series-window';

/** One job per series per run: data RefitSeriesJob. */
export const refitSeriesQueue = 'refit-series';
/** The nightly schedule fires into this queue; its handler fans out a run over every active series. */
export const refitNightlyQueue = 'refit-nightly';

/** Data of a 'refit-series' job. */
export interface RefitSeriesJob {
  runId: number;
  seriesId: number;
}

/** Retry and expiry of refit jobs, from REFIT_RETRY_LIMIT, REFIT_RETRY_DELAY_SECONDS (defaults 2 and 30 s, doubling). */
export function refitQueueOptions(env: NodeJS.ProcessEnv = process.env): Omit<PgBoss.Queue, 'name'> {
  const limit = Number(env['REFIT_RETRY_LIMIT'] ?? 2);
  const delay = Number(env['REFIT_RETRY_DELAY_SECONDS'] ?? 30);
  return {
    retryLimit: Number.isInteger(limit) && limit >= 0 ? limit : 2,
    retryDelay: Number.isFinite(delay) && delay >= 0 ? delay : 30,
    retryBackoff: true,
    // A killed worker's jobs are handed back by the worker heartbeat within about a minute
    // (jobs/worker-presence.ts); expiry only catches a refit that hangs in a live worker. One refit
    // takes seconds, a batch of WORKER_CONCURRENCY well under a minute on two cores.
    expireInSeconds: 300,
  };
}

/**
 * One refit of a series at a time: the series queue has pg-boss 10's `singleton` policy, under which
 * at most one job per singleton key is active (a unique index on active jobs), and every job's key is
 * its series. A second refit of a series, from another run, waits in the queue until the first ends,
 * so two writes of one series never race for its single draft.
 */
export const refitSeriesPolicy: PgBoss.QueuePolicy = 'singleton';

/** The singleton key of a series' refit jobs: one active at a time per key. */
export function refitSeriesKey(seriesId: number): string {
  return `series-${seriesId}`;
}

/** Creates both refit queues (or brings their settings up to date). */
export async function createRefitQueues(boss: PgBoss): Promise<void> {
  const options = refitQueueOptions();
  for (const name of [refitSeriesQueue, refitNightlyQueue]) {
    await ensureQueue(boss, name, { ...options, ...(name === refitSeriesQueue && { policy: refitSeriesPolicy }) });
  }
}

/** Adds jobs on a given connection (so they commit or roll back with the caller's transaction). */
export type JobInserter = (jobs: PgBoss.JobInsert[], connection: Queryable) => Promise<void>;

/** A JobInserter that needs no running pg-boss: pg-boss's insert statement run on the caller's connection. */
export function createJobInserter(): JobInserter {
  const boss = new PgBoss({
    db: { executeSql: async () => ({ rows: [] }) },
    schema: 'pgboss',
    supervise: false,
    schedule: false,
    migrate: false,
  });
  return async (jobs, connection) => {
    await boss.insert(jobs, {
      db: { executeSql: (text, values) => connection.query({ text, values }) },
    });
  };
}

/** True when the refit queue exists (a worker has started at least once against this database). */
export async function refitQueueReady(db: Queryable): Promise<boolean> {
  const { rows } = await db.query({ text: `select to_regclass('pgboss.queue') is not null as installed` });
  if (!(rows[0] as { installed: boolean }).installed) return false;
  const found = await db.query({ text: 'select 1 from pgboss.queue where name = $1', values: [refitSeriesQueue] });
  return found.rows.length > 0;
}
