/**
 * A real Loadwright for a test file: its own migrated database, the API on a free loopback port
 * serving the built web app, and an in-process worker on the same job queue.
 */
import type { AddressInfo } from 'node:net';
import { resolve } from 'node:path';
import pg from 'pg';
import { pino } from 'pino';
import { createApp } from '../../apps/api/src/app';
import { createBoss } from '../../jobs/boss';
import { registerQueues } from '../../jobs/queues';
import { createTestDatabase } from './database';

const repoRoot = resolve(import.meta.dirname, '../..');

/** A running test instance. */
export interface TestServer {
  url: string;
  databaseUrl: string;
  pool: pg.Pool;
  close(): Promise<void>;
}

/** Starts an instance; call close() in afterAll. */
export async function startTestServer(options: { worker?: boolean } = {}): Promise<TestServer> {
  const databaseUrl = await createTestDatabase();
  const logger = pino({ level: process.env['TEST_LOG_LEVEL'] ?? 'silent' });
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 5 });
  const boss = options.worker === false ? undefined : createBoss(databaseUrl, { supervise: true });
  if (boss) {
    boss.on('error', (error) => logger.error({ err: error }, 'job queue error'));
    await boss.start();
    await registerQueues(boss, { logger, concurrency: 2, databaseUrl });
  }
  const app = createApp({ pool, logger, webDist: resolve(repoRoot, 'dist/web/browser') });
  const server = app.listen(0, '127.0.0.1');
  await new Promise<void>((done) => server.once('listening', done));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    databaseUrl,
    pool,
    async close() {
      await new Promise<void>((done) => server.close(() => done()));
      server.closeAllConnections();
      await boss?.stop({ wait: true, timeout: 5_000 });
      await pool.end();
    },
  };
}
