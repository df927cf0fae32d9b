/** The API process: reads its configuration, connects to PostgreSQL and serves until told to stop. */
import { randomBytes } from 'node:crypto';
import { resolve } from 'node:path';
import { createDb, isDatabaseUnavailable } from '@loadwright/db';
import { pino } from 'pino';
import { createApp } from './app';
import { ConfigError, loadConfig, type Config } from '@loadwright/runtime';
import { logSerializers, stopWithParent } from '@loadwright/runtime';

const repoRoot = resolve(import.meta.dirname, '../../..');

/** Starts the server; resolves once it listens. */
export async function startServer(config: Config) {
  const logger = pino({ level: config.LOG_LEVEL, name: 'api', serializers: logSerializers });
  if (!config.DATABASE_URL) throw new ConfigError('Invalid configuration:\n  DATABASE_URL is required by the API (npm start sets it)');
  let secret = config.SESSION_SECRET;
  if (!secret) {
    logger.warn('SESSION_SECRET is not set: using a random one, so sessions end when this process restarts');
    secret = randomBytes(48).toString('base64');
  }
  const publicUrl = config.PUBLIC_URL ?? `http://${config.HOST}:${config.PORT}`;
  const { db, pool, close } = createDb(config.DATABASE_URL, { applicationName: 'loadwright-api' });
  // Requests that hit a lost database answer 503 (problem-middleware.ts); a lost connection that
  // surfaces outside a request is logged, not fatal, and the pool reconnects on the next query.
  process.on('unhandledRejection', (error: unknown) => {
    if (!isDatabaseUnavailable(error)) throw error;
    logger.warn({ err: error }, 'database unavailable');
  });
  const app = createApp({
    db,
    pool,
    logger,
    sessionSecret: new TextEncoder().encode(secret),
    secureCookies: publicUrl.startsWith('https:'),
    publicUrl,
    outboxFolder: config.OUTBOX_FOLDER,
    webDist: resolve(repoRoot, config.WEB_DIST),
    uploadMaxBytes: config.UPLOAD_MAX_MB * 1024 * 1024,
  });
  const server = app.listen(config.PORT, config.HOST);
  await new Promise<void>((done, fail) => server.once('listening', done).once('error', fail));
  logger.info({ url: publicUrl }, 'API listening');
  const stop = async () => {
    await new Promise<void>((done) => server.close(() => done()));
    await close();
  };
  return { server, stop };
}

if (process.argv[1] === import.meta.filename) {
  try {
    const { stop } = await startServer(loadConfig());
    for (const signal of ['SIGINT', 'SIGTERM'] as const) process.once(signal, () => void stop().then(() => process.exit(0)));
    stopWithParent(stop);
  } catch (error) {
    console.error(error instanceof ConfigError ? error.message : `API failed to start: ${(error as Error).message}`);
    process.exit(1);
  }
}
