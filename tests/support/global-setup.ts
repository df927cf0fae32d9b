/**
 * Integration-test setup: starts the project's PostgreSQL on loopback (or uses DATABASE_URL's server),
 * creates a migrated throwaway template database for this run, and hands its details to the tests.
 * Each test file clones its own database from the template (see database.ts), so files never see
 * each other's rows. Everything created here is dropped at the end.
 */
import type { TestProject } from 'vitest/node';
import { migrate } from '@loadwright/db';
import { createDatabase, defaultLocation, dropDatabase, ensurePostgres, stopPostgres } from '../../scripts/postgres';
import { buildWeb, isWebBuildStale } from '../../scripts/web-build';

declare module 'vitest' {
  export interface ProvidedContext {
    /** Connection URL of the server's maintenance database, for creating and dropping databases. */
    adminDatabaseUrl: string;
    /** Name of this run's migrated, empty template database. */
    templateDatabase: string;
  }
}

export default async function setup(project: TestProject) {
  // Browser tests load the production build that the API serves, exactly as `npm start` does.
  // LOADWRIGHT_SKIP_WEB_BUILD=1 skips it while working on the server alone (browser tests then use the last build).
  if (process.env['LOADWRIGHT_SKIP_WEB_BUILD'] !== '1' && isWebBuildStale()) await buildWeb();
  const { adminUrl, startedHere } = await ensurePostgres();
  const template = `lw_test_${Date.now().toString(36)}_${process.pid}`;
  await createDatabase(adminUrl, template);
  const templateUrl = new URL(adminUrl);
  templateUrl.pathname = `/${template}`;
  await migrate(templateUrl.toString());
  project.provide('adminDatabaseUrl', adminUrl);
  project.provide('templateDatabase', template);

  return async () => {
    await dropRunDatabases(adminUrl, template);
    if (startedHere && !process.env['DATABASE_URL']) await stopPostgres(defaultLocation());
  };
}

/** Drops the template and every database cloned from it in this run. */
async function dropRunDatabases(adminUrl: string, template: string): Promise<void> {
  const pg = await import('pg');
  const client = new pg.default.Client({ connectionString: adminUrl });
  await client.connect();
  const { rows } = await client.query<{ datname: string }>('SELECT datname FROM pg_database WHERE datname LIKE $1', [`${template}%`]);
  await client.end();
  for (const { datname } of rows) await dropDatabase(adminUrl, datname);
}
