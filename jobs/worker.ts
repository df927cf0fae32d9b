/**
 * A worker process: connects to the job queue in PostgreSQL and serves the product's queues. Any
 * number of these may run, on any number of machines, against one database; pg-boss hands each job
 * to exactly one of them.
 */
import { pino } from 'pino';
import { isDatabaseUnavailable } from '@loadwright/db';
import { ConfigError, loadConfig } from '@loadwright/runtime';
import { logSerializers, stopWithParent } from '@loadwright/runtime';
import { createBoss } from './boss';
import { registerQueues } from './queues';

const config = (() => {
  try {
    return loadConfig();
  } catch (error) {
    console.error(error instanceof ConfigError ? error.message : String(error));
    process.exit(1);
  }
})();
const logger = pino({ level: config.LOG_LEVEL, name: process.env['WORKER_NAME'] ?? 'worker', serializers: logSerializers });
if (!config.DATABASE_URL) {
  logger.fatal('DATABASE_URL is required by the worker (npm start sets it)');
  process.exit(1);
}

// pg-boss 10 records a job's completion or failure without awaiting it (Manager.watch calls
// this.fail(...) unawaited), so a database restart during a job surfaced as an unhandled rejection
// that killed the worker; a lost connection can also surface outside any handler. While the
// database is away such errors are logged, not fatal. The jobs
// they leave active are handed back by the reaper once the database returns (worker-presence.ts).
// Anything else is a bug: log it and exit, and `npm start` restarts the worker.
for (const event of ['unhandledRejection', 'uncaughtException'] as const)
  process.on(event, (error: unknown) => {
    if (isDatabaseUnavailable(error)) return logger.warn({ err: error }, 'database unavailable; the worker waits for it');
    logger.fatal({ err: error }, `worker stopping on ${event}`);
    process.exit(1);
  });

const boss = createBoss(config.DATABASE_URL, { supervise: true });
boss.on('error', (error) => logger[isDatabaseUnavailable(error) ? 'warn' : 'error']({ err: error }, 'job queue error'));
await startWhenDatabaseAnswers();
await registerQueues(boss, {
  logger,
  concurrency: config.WORKER_CONCURRENCY,
  databaseUrl: config.DATABASE_URL,
  heartbeatSeconds: config.WORKER_HEARTBEAT_SECONDS,
  ...(config.SMTP_URL ? { smtpUrl: config.SMTP_URL } : {}),
  mailFrom: config.MAIL_FROM,
  publicUrl: config.PUBLIC_URL ?? `http://${config.HOST}:${config.PORT}`,
});
logger.info({ concurrency: config.WORKER_CONCURRENCY, heartbeatSeconds: config.WORKER_HEARTBEAT_SECONDS }, 'worker ready');

/** Starts pg-boss, waiting (2 s apart) while the database is unreachable instead of exiting. */
async function startWhenDatabaseAnswers(): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    try {
      await boss.start();
      return;
    } catch (error) {
      if (!isDatabaseUnavailable(error)) throw error;
      if (attempt === 1) logger.warn({ err: error }, 'database unavailable at start; waiting for it');
      await new Promise((done) => setTimeout(done, 2_000));
    }
  }
}

const stop = async () => {
  logger.info('worker stopping: finishing jobs in hand');
  await boss.stop({ wait: true, graceful: true, timeout: 20_000 });
};
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.once(signal, () => void stop().then(() => process.exit(0)));
stopWithParent(stop);
