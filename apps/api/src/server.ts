/** The API process: reads its configuration, connects to PostgreSQL and serves until told to stop. */
import { resolve } from 'node:path';
import pg from 'pg';
import { pino } from 'pino';
import { createApp } from './app';
import { ConfigError, loadConfig, type Config } from './config';

const repoRoot = resolve(import.meta.dirname, '../../..');

/** Starts the server; resolves once it listens. */
export async function startServer(config: Config) {
  const logger = pino({ level: config.LOG_LEVEL, name: 'api' });
  if (!config.DATABASE_URL) throw new ConfigError('Invalid configuration:\n  DATABASE_URL is required by the API (npm start sets it)');
  const pool = new pg.Pool({ connectionString: config.DATABASE_URL, max: 10 });
  pool.on('error', (error) => logger.error({ err: error }, 'idle database connection failed'));
  const app = createApp({ pool, logger, webDist: resolve(repoRoot, config.WEB_DIST) });
  const server = app.listen(config.PORT, config.HOST);
  await new Promise<void>((done, fail) => server.once('listening', done).once('error', fail));
  logger.info({ url: `http://${config.HOST}:${config.PORT}` }, 'API listening');
  const stop = async () => {
    await new Promise<void>((done) => server.close(() => done()));
    await pool.end();
  };
  return { server, stop };
}

if (process.argv[1] === import.meta.filename) {
  try {
    const { stop } = await startServer(loadConfig());
    for (const signal of ['SIGINT', 'SIGTERM'] as const) process.once(signal, () => void stop().then(() => process.exit(0)));
  } catch (error) {
    console.error(error instanceof ConfigError ? error.message : `API failed to start: ${(error as Error).message}`);
    process.exit(1);
  }
}
