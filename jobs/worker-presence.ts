/**
 * A worker's presence: a heartbeat row in `worker_heartbeats` (written every `beatSeconds`) that lists
 * the pg-boss jobs its handlers hold, and a reaper that gives the jobs of dead workers back to the queue.
 *
 * Rule, the same for any number of workers on any number of machines: a worker is live while its last
 * beat is younger than three of its own beat intervals. An active job of a queue listed in
 * `leasedQueues` that no live worker holds, and that has been active for longer than three beats, is
 * failed through pg-boss, which retries it with the queue's delay (or fails it for good on its last
 * attempt). So work interrupted by a killed worker, a lost machine or a database restart resumes
 * within about 3 beats + the reaper's pass + the retry delay (30 s + 10 s + 20–30 s by default),
 * while a healthy import that runs for an hour is never touched: its worker keeps beating and
 * holding it. pg-boss's own expiry stays as the backstop for a handler that hangs in a live worker.
 * Handlers must be idempotent (imports and refits are: see libs/intake and libs/refits).
 */
import { randomUUID } from 'node:crypto';
import { hostname } from 'node:os';
import pg from 'pg';
import type PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import { importQueue } from '@loadwright/intake';
import { refitNightlyQueue, refitSeriesQueue, settingsTrialQueue } from '@loadwright/refits';
import { scoreAccuracyQueue } from '@loadwright/accuracy';

/** Queues whose active jobs are held by a worker's heartbeat and reaped when that worker dies. */
export const leasedQueues = [importQueue, refitSeriesQueue, refitNightlyQueue, scoreAccuracyQueue, settingsTrialQueue];

/** Default seconds between heartbeats (WORKER_HEARTBEAT_SECONDS). */
export const defaultBeatSeconds = 10;

/** Beats a worker may miss before it counts as dead. */
export const missedBeatsAllowed = 3;

/** What a running worker's presence offers its handlers. */
export interface WorkerPresence {
  /** This process's id in `worker_heartbeats`. */
  readonly id: string;
  /** Runs `work` with `jobIds` listed as held by this worker (until a beat after it ends). */
  hold<T>(jobIds: string[], work: () => Promise<T>): Promise<T>;
  /** Stops beating and reaping and deletes this worker's row. */
  stop(): Promise<void>;
}

/** Settings of {@link startWorkerPresence}. */
export interface PresenceOptions {
  databaseUrl: string;
  /** Name in logs and on the Overview, e.g. worker-1. */
  name: string;
  logger: Logger;
  beatSeconds?: number;
  /** Runs after each reaper pass, with the same pool (e.g. sweeping uploads whose job is gone). */
  afterReap?: (pool: pg.Pool) => Promise<void>;
}

/** Writes the first beat (so the worker shows as live at once) and starts beating and reaping. */
export async function startWorkerPresence(boss: PgBoss, options: PresenceOptions): Promise<WorkerPresence> {
  const { logger } = options;
  const beatSeconds = options.beatSeconds ?? defaultBeatSeconds;
  const id = randomUUID();
  const pool = new pg.Pool({
    connectionString: options.databaseUrl,
    max: 2,
    application_name: 'loadwright-presence',
    connectionTimeoutMillis: 10_000,
    idleTimeoutMillis: 5_000,
  });
  pool.on('error', (error) => logger.warn({ err: error }, 'heartbeat connection lost'));
  const held = new Map<string, number>();
  const running = new Set<string>();
  let stopped = false;

  const beat = async () => {
    // Jobs whose handler ended are kept one more beat, so pg-boss's completion (sent right after) lands first.
    const now = Date.now();
    for (const [jobId, endedAt] of held) if (!running.has(jobId) && now - endedAt > beatSeconds * 1000) held.delete(jobId);
    await pool.query(
      `insert into worker_heartbeats (id, name, host, pid, beat_seconds, jobs) values ($1, $2, $3, $4, $5, $6::uuid[])
       on conflict (id) do update set beat_at = now(), jobs = excluded.jobs`,
      [id, options.name, hostname(), process.pid, beatSeconds, [...held.keys()]],
    );
  };
  const reap = async () => {
    const reaped = await reapOrphanedJobs(pool, boss);
    for (const { queue, ids } of reaped) logger.warn({ queue, jobs: ids }, 'jobs of a stopped worker handed back to the queue');
    await options.afterReap?.(pool);
  };
  await beat();
  let busy = false;
  const timer = setInterval(() => {
    if (busy || stopped) return;
    busy = true;
    beat()
      .then(reap)
      .catch((error) => logger.warn({ err: error }, 'heartbeat or reaper pass failed; retrying at the next beat'))
      .finally(() => {
        busy = false;
      });
  }, beatSeconds * 1000);
  timer.unref();

  return {
    id,
    async hold(jobIds, work) {
      for (const jobId of jobIds) {
        held.set(jobId, Infinity);
        running.add(jobId);
      }
      try {
        return await work();
      } finally {
        for (const jobId of jobIds) {
          running.delete(jobId);
          held.set(jobId, Date.now());
        }
      }
    },
    async stop() {
      if (stopped) return;
      stopped = true;
      clearInterval(timer);
      await pool.query('delete from worker_heartbeats where id = $1', [id]).catch(() => {});
      await pool.end().catch(() => {});
    },
  };
}

/** Jobs handed back in one pass, by queue. */
export interface ReapedJobs {
  queue: string;
  ids: string[];
}

/**
 * Fails (so pg-boss retries) every active job of a leased queue that no live worker holds and that
 * has been active for longer than the longest live worker's allowance (so a job just fetched, not yet
 * in its worker's next beat, is never taken). Also prunes rows of workers gone for a day.
 */
export async function reapOrphanedJobs(pool: pg.Pool, boss: PgBoss): Promise<ReapedJobs[]> {
  const { rows } = await pool.query<{ id: string; name: string }>(
    `with live as (
       select jobs, beat_seconds from worker_heartbeats where beat_at > now() - make_interval(secs => $2 * beat_seconds)
     )
     select j.id, j.name from pgboss.job j
      where j.name = any($1::text[]) and j.state = 'active'
        and j.started_on < now() - make_interval(secs => $2 * (select coalesce(max(beat_seconds), $3) from live))
        and not exists (select 1 from live where j.id = any(live.jobs))`,
    [leasedQueues, missedBeatsAllowed, defaultBeatSeconds],
  );
  await pool.query(`delete from worker_heartbeats where beat_at < now() - interval '1 day'`);
  const byQueue = new Map<string, string[]>();
  for (const row of rows) byQueue.set(row.name, [...(byQueue.get(row.name) ?? []), row.id]);
  const reaped: ReapedJobs[] = [];
  for (const [queue, ids] of byQueue) {
    for (const jobId of ids)
      await boss.fail(queue, jobId, { message: 'the worker running this job stopped (no heartbeat); handed back to the queue' });
    reaped.push({ queue, ids });
  }
  return reaped;
}
