/**
 * A worker process: connects to the job queue in PostgreSQL and serves the product's queues. Any
 * number of these may run, on any number of machines, against one database; pg-boss hands each job
 * to exactly one of them.
 */
import { pino } from 'pino';
import { ConfigError, loadConfig } from '@loadwright/runtime';
import { stopWithParent } from '@loadwright/runtime';
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
const logger = pino({ level: config.LOG_LEVEL, name: process.env['WORKER_NAME'] ?? 'worker' });
if (!config.DATABASE_URL) {
  logger.fatal('DATABASE_URL is required by the worker (npm start sets it)');
  process.exit(1);
}

const boss = createBoss(config.DATABASE_URL, { supervise: true });
boss.on('error', (error) => logger.error({ err: error }, 'job queue error'));
await boss.start();
await registerQueues(boss, { logger, concurrency: config.WORKER_CONCURRENCY, databaseUrl: config.DATABASE_URL });
logger.info({ concurrency: config.WORKER_CONCURRENCY }, 'worker ready');

const stop = async () => {
  logger.info('worker stopping: finishing jobs in hand');
  await boss.stop({ wait: true, graceful: true, timeout: 20_000 });
};
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.once(signal, () => void stop().then(() => process.exit(0)));
stopWithParent(stop);
