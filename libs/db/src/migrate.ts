import { resolve } from 'node:path';
import { drizzle } from 'drizzle-orm/node-postgres';
import { migrate as applyMigrations } from 'drizzle-orm/node-postgres/migrator';
import pg from 'pg';

/** The repository's drizzle/ folder, found from this file so the caller's working directory does not matter. */
export const migrationsFolder = resolve(import.meta.dirname, '../../../drizzle');

/** Advisory lock key reserved for migrations; any fixed bigint works if no one else uses it. */
const migrationLockKey = '7357264201';

/**
 * Applies every migration in drizzle/ not yet applied to the database at `url`. Already applied
 * migrations are skipped, so running it again is a no-op. Concurrent callers (API and worker
 * starting together) are serialised by a session advisory lock.
 */
export async function migrate(url: string): Promise<void> {
  const client = new pg.Client({ connectionString: url, application_name: 'loadwright-migrate' });
  await client.connect();
  try {
    await client.query('select pg_advisory_lock($1)', [migrationLockKey]);
    await applyMigrations(drizzle(client), { migrationsFolder });
  } finally {
    await client.end();
  }
}
