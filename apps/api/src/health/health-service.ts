/** Builds the health report: can we reach PostgreSQL, what is waiting in the job queues, which workers are live. */
import type { HealthReport, QueueDepth, WorkerProcess } from '@loadwright/contracts';
import type { Pool } from 'pg';

const version = process.env['npm_package_version'] ?? '0.1.0';

/** Beats a worker may miss before it counts as dead (the same rule as jobs/worker-presence.ts). */
const missedBeatsAllowed = 3;

/** Checks the database, the pg-boss queues and the workers' heartbeats through one connection pool. */
export async function checkHealth(pool: Pool): Promise<HealthReport> {
  const database = await timed(async () => {
    await pool.query('SELECT 1');
    return 'connected';
  });
  let queues: QueueDepth[] = [];
  let processes: WorkerProcess[] = [];
  const unreachable = { ok: false, latencyMs: null, detail: 'database unreachable' };
  const queue = database.ok
    ? await timed(async () => {
        queues = await readQueueDepths(pool);
        return queues.length ? `${queues.length} queues` : 'installed, no queues yet';
      })
    : unreachable;
  const workers = database.ok
    ? await timed(async () => {
        processes = await readWorkers(pool);
        return describeWorkers(processes);
      })
    : unreachable;
  // A worker check that ran but found no live worker is still a failing component.
  if (workers.ok && !processes.some((p) => p.live)) workers.ok = false;
  return {
    status: database.ok && queue.ok && workers.ok ? 'ok' : 'degraded',
    version,
    checkedAt: new Date().toISOString(),
    database,
    queue: { ...queue, queues },
    workers: { ...workers, processes },
  };
}

/** Counts jobs per queue and state from pg-boss's own tables. */
async function readQueueDepths(pool: Pool): Promise<QueueDepth[]> {
  const installed = await pool.query(`SELECT to_regclass('pgboss.job') IS NOT NULL AS present`);
  if (!installed.rows[0]?.present) throw new Error('job queue not installed yet (the worker installs it when it starts)');
  const { rows } = await pool.query<{ name: string; queued: string; active: string; failed: string }>(`
    SELECT q.name,
           count(j.id) FILTER (WHERE j.state IN ('created', 'retry')) AS queued,
           count(j.id) FILTER (WHERE j.state = 'active') AS active,
           count(j.id) FILTER (WHERE j.state = 'failed') AS failed
      FROM pgboss.queue q LEFT JOIN pgboss.job j ON j.name = q.name
     WHERE q.name NOT LIKE '\\_\\_%'
     GROUP BY q.name ORDER BY q.name`);
  return rows.map((row) => ({ name: row.name, queued: Number(row.queued), active: Number(row.active), failed: Number(row.failed) }));
}

/** Workers that beat in the last ten minutes (older rows belong to workers long gone), live first. */
async function readWorkers(pool: Pool): Promise<WorkerProcess[]> {
  const { rows } = await pool.query<{
    name: string;
    host: string;
    pid: number;
    started_at: Date;
    beat_at: Date;
    beat_seconds: number;
    live: boolean;
    jobs: number;
  }>(
    `SELECT name, host, pid, started_at, beat_at, beat_seconds, cardinality(jobs) AS jobs,
            beat_at > now() - make_interval(secs => $1 * beat_seconds) AS live
       FROM worker_heartbeats WHERE beat_at > now() - interval '10 minutes'
      ORDER BY live DESC, name, started_at DESC`,
    [missedBeatsAllowed],
  );
  return rows.map((row) => ({
    name: row.name,
    host: row.host,
    pid: row.pid,
    startedAt: row.started_at.toISOString(),
    lastBeatAt: row.beat_at.toISOString(),
    beatSeconds: row.beat_seconds,
    live: row.live,
    jobsInHand: row.jobs,
  }));
}

/** "2 workers running, 3 jobs in hand", or why none is. */
function describeWorkers(processes: WorkerProcess[]): string {
  const live = processes.filter((p) => p.live);
  const jobs = live.reduce((sum, p) => sum + p.jobsInHand, 0);
  const dead = processes.length - live.length;
  if (live.length === 0)
    return dead > 0
      ? `0 workers running: ${dead === 1 ? 'a worker' : `${dead} workers`} stopped sending heartbeats; uploads and refits wait until one runs`
      : '0 workers running: no worker has started against this database; uploads and refits wait until one runs';
  const stopped = dead > 0 ? `; ${dead} stopped recently` : '';
  return `${live.length} ${live.length === 1 ? 'worker' : 'workers'} running, ${jobs} ${jobs === 1 ? 'job' : 'jobs'} in hand${stopped}`;
}

async function timed(check: () => Promise<string>): Promise<{ ok: boolean; latencyMs: number | null; detail: string }> {
  const started = performance.now();
  try {
    const detail = await check();
    return { ok: true, latencyMs: Math.round((performance.now() - started) * 10) / 10, detail };
  } catch (error) {
    return { ok: false, latencyMs: null, detail: (error as Error).message.split('\n')[0]!.slice(0, 200) };
  }
}
