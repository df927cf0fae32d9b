/**
 * A real Loadwright for a test file: its own migrated database, the API on a free loopback port
 * serving the built web app, the local mail catcher, and an in-process worker on the same job queue.
 */
import { randomBytes } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { createDb, type Database } from '@loadwright/db';
import type { Express } from 'express';
import type pg from 'pg';
import { pino } from 'pino';
import { logSerializers } from '@loadwright/runtime';
import { createApp } from '../../apps/api/src/app';
import type { RouteDefinition } from '../../apps/api/src/http/route-table';
import { startMailCatcher, type MailCatcher } from '@loadwright/mail';
import { createBoss } from '../../jobs/boss';
import { registerQueues } from '../../jobs/queues';
import { createTestDatabase } from './database';

const repoRoot = resolve(import.meta.dirname, '../..');

/** A running test instance. */
export interface TestServer {
  url: string;
  databaseUrl: string;
  db: Database;
  pool: pg.Pool;
  /** Folder where the mail catcher keeps what it received over SMTP. */
  outboxFolder: string;
  /** The Express application, for tests that inspect what it mounts. */
  app: Express;
  /** Every declared API route. */
  routes: RouteDefinition[];
  /** The mail catcher as a mail server that can go down and come back on the same port. */
  mailServer: { stop(): Promise<void>; start(): Promise<void> };
  close(): Promise<void>;
}

/** Starts an instance; call close() in afterAll. */
export async function startTestServer(
  options: {
    worker?: boolean;
    logLines?: string[];
    /** A migrated database of the test's own (default: a fresh clone). */
    databaseUrl?: string;
    /** Send mail here instead of the local catcher, e.g. a port nothing listens on to see mail fail. */
    smtpUrl?: string;
  } = {},
): Promise<TestServer> {
  const databaseUrl = options.databaseUrl ?? (await createTestDatabase());
  // Tests that check what reaches the log pass an array that collects every line.
  const logger = options.logLines
    ? pino({ level: 'trace', serializers: logSerializers }, { write: (line: string) => void options.logLines!.push(line) })
    : pino({ level: process.env['TEST_LOG_LEVEL'] ?? 'silent', serializers: logSerializers });
  const { db, pool, close: closeDb } = createDb(databaseUrl, { max: 5, applicationName: 'loadwright-test' });
  const outboxFolder = mkdtempSync(join(tmpdir(), 'lw-outbox-'));
  let catcher: MailCatcher | undefined = await startMailCatcher(outboxFolder);
  const smtpPort = catcher.port;
  const boss = options.worker === false ? undefined : createBoss(databaseUrl, { supervise: true });
  if (boss) {
    boss.on('error', (error) => logger.error({ err: error }, 'job queue error'));
    await boss.start();
    await registerQueues(boss, {
      logger,
      concurrency: 2,
      databaseUrl,
      smtpUrl: options.smtpUrl ?? catcher.smtpUrl,
      mailFrom: 'Loadwright <loadwright@test.example>',
      publicUrl: 'http://127.0.0.1',
    });
  }
  const app = createApp({
    db,
    pool,
    logger,
    sessionSecret: randomBytes(48),
    secureCookies: false,
    publicUrl: 'http://127.0.0.1',
    outboxFolder,
    webDist: resolve(repoRoot, 'dist/web/browser'),
  });
  const server = app.listen(0, '127.0.0.1');
  await new Promise<void>((done) => server.once('listening', done));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    databaseUrl,
    db,
    pool,
    outboxFolder,
    app,
    routes: app.locals['routes'] as RouteDefinition[],
    mailServer: {
      async stop() {
        await catcher?.stop();
        catcher = undefined;
      },
      async start() {
        catcher ??= await startMailCatcher(outboxFolder, smtpPort);
      },
    },
    async close() {
      server.closeAllConnections();
      await new Promise<void>((done) => server.close(() => done()));
      await boss?.stop({ wait: true, timeout: 5_000 });
      await catcher?.stop();
      await closeDb();
    },
  };
}
