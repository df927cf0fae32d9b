/** The pg-boss instance shared by the worker and the API (which only sends jobs). */
import PgBoss from 'pg-boss';

/** Options that differ between the worker, which runs schedules and supervises, and senders. */
export interface BossOptions {
  /** Runs cron schedules and queue maintenance: true in workers only. */
  supervise: boolean;
  /**
   * Seconds between checks of cron schedules and between runs of the schedule's sender (pg-boss
   * defaults 30 and 5; 1–45). Tests shorten them to see a per-minute cron fire promptly.
   */
  cronMonitorIntervalSeconds?: number;
  /** See cronMonitorIntervalSeconds. */
  cronWorkerIntervalSeconds?: number;
}

/** Creates (but does not start) a pg-boss client on the product's database. */
export function createBoss(databaseUrl: string, { supervise, cronMonitorIntervalSeconds, cronWorkerIntervalSeconds }: BossOptions): PgBoss {
  return new PgBoss({
    ...(cronMonitorIntervalSeconds === undefined ? {} : { cronMonitorIntervalSeconds }),
    ...(cronWorkerIntervalSeconds === undefined ? {} : { cronWorkerIntervalSeconds }),
    connectionString: databaseUrl,
    schema: 'pgboss',
    supervise,
    schedule: supervise,
    migrate: true,
    max: 4,
    // Expiry is the backstop for a handler that hangs in a live worker (a dead worker's jobs are
    // handed back by worker-presence.ts); check it every 30 s instead of pg-boss's default 120 s.
    maintenanceIntervalSeconds: 30,
  });
}
