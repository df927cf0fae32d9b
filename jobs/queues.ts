/**
 * The product's queues and their handlers, registered by every worker process. Each queue is created
 * explicitly (pg-boss 10 ignores jobs sent to a queue that does not exist).
 */
import type PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import { registerImportQueue } from './import.worker';
import { registerRefitQueues } from './refit-queues';

/** What a queue's handler may use. */
export interface WorkerContext {
  logger: Logger;
  concurrency: number;
  databaseUrl: string;
}

/** Creates every queue and starts its handler. Queues are added here as features land. */
export async function registerQueues(boss: PgBoss, context: WorkerContext): Promise<void> {
  await registerImportQueue(boss, context);
  // The intake (import) queue registers here too.
  await registerRefitQueues(boss, context);
}
