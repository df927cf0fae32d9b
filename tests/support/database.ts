/** Per-file databases for integration tests: a clone of the run's migrated template. */
import { inject } from 'vitest';
import { createDatabase } from '../../scripts/postgres';

let clones = 0;

/** Creates an empty, migrated database of its own and returns its URL. */
export async function createTestDatabase(): Promise<string> {
  const adminUrl = inject('adminDatabaseUrl');
  const template = inject('templateDatabase');
  const name = `${template}_${process.pid}_${++clones}`;
  await createDatabase(adminUrl, name, template);
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return url.toString();
}
