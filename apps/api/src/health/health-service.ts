/** Builds the health report: can we reach PostgreSQL, and what is waiting in the job queues. */
import type { HealthReport, QueueDepth } from '@loadwright/contracts';
import type { Pool } from 'pg';

const version = process.env['npm_package_version'] ?? '0.1.0';

/** Checks the database and the pg-boss queues through one connection pool. */
export async function checkHealth(pool: Pool): Promise<HealthReport> {
  const database = await timed(async () => {
    await pool.query('SELECT 1');
    return 'connected';
  });
  let queues: QueueDepth[] = [];
  const queue = database.ok
    ? await timed(async () => {
        queues = await readQueueDepths(pool);
        return queues.length ? `${queues.length} queues` : 'installed, no queues yet';
      })
    : { ok: false, latencyMs: null, detail: 'database unreachable' };
  return {
    status: database.ok && queue.ok ? 'ok' : 'degraded',
    version,
    checkedAt: new Date().toISOString(),
    database,
    queue: { ...queue, queues },
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

async function timed(check: () => Promise<string>): Promise<{ ok: boolean; latencyMs: number | null; detail: string }> {
  const started = performance.now();
  try {
    const detail = await check();
    return { ok: true, latencyMs: Math.round((performance.now() - started) * 10) / 10, detail };
  } catch (error) {
    return { ok: false, latencyMs: null, detail: (error as Error).message.split('\n')[0]!.slice(0, 200) };
  }
}
