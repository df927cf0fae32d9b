/** The pg-boss instance shared by the worker and the API (which only sends jobs). */
import PgBoss from 'pg-boss';

/** Options that differ between the worker, which runs schedules and supervises, and senders. */
export interface BossOptions {
  /** Runs cron schedules and queue maintenance: true in workers only. */
  supervise: boolean;
}

/** Creates (but does not start) a pg-boss client on the product's database. */
export function createBoss(databaseUrl: string, { supervise }: BossOptions): PgBoss {
  return new PgBoss({
    connectionString: databaseUrl,
    schema: 'pgboss',
    supervise,
    schedule: supervise,
    migrate: true,
    max: 4,
  });
}
