/**
 * The product's queues and their handlers, registered by every worker process. Each queue is created
 * explicitly (pg-boss 10 ignores jobs sent to a queue that does not exist). The worker's presence
 * (heartbeat and reaper, see worker-presence.ts) starts first, so every job a handler takes is held.
 */
import type PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import { registerImportQueue } from './import.worker';
import { sweepOrphanedImports } from './import-sweeper';
import { sweepOrphanedTrials } from './settings-trial-sweeper';
import { registerRefitQueues } from './refit-queues';
import { registerMailQueue } from './send-mail.worker';
import { registerSettingsTrialQueue } from './settings-trial.worker';
import { registerDetectionQueues } from './detect-misses.worker';
import { registerScoringQueues } from './score-accuracy.worker';
import { startWorkerPresence, type WorkerPresence } from './worker-presence';

/** What a queue's handler may use. */
export interface WorkerContext {
  logger: Logger;
  concurrency: number;
  databaseUrl: string;
  /** Name in logs and on the Overview (default: WORKER_NAME, else "worker"). */
  name?: string;
  /** Seconds between heartbeats (default 10). */
  heartbeatSeconds?: number;
  /** The mail server the 'send-mail' queue delivers to (npm start sets the local catcher's). */
  smtpUrl?: string;
  /** Sender when the organisation has set none (default Loadwright <loadwright@localhost>). */
  mailFrom?: string;
  /** The address people open, for links in e-mail (default http://127.0.0.1:4280). */
  publicUrl?: string;
}

/** A handler's context once the worker's presence runs. */
export interface QueueContext extends WorkerContext {
  presence: WorkerPresence;
}

/** Creates every queue and starts its handler; stops the presence when pg-boss stops. */
export async function registerQueues(boss: PgBoss, context: WorkerContext): Promise<WorkerPresence> {
  const presence = await startWorkerPresence(boss, {
    databaseUrl: context.databaseUrl,
    name: context.name ?? process.env['WORKER_NAME'] ?? 'worker',
    logger: context.logger,
    beatSeconds: context.heartbeatSeconds,
    afterReap: async (pool) => {
      const failed = await sweepOrphanedImports(pool);
      if (failed.length) context.logger.warn({ uploads: failed }, 'uploads whose import job is gone marked failed');
      const trials = await sweepOrphanedTrials(pool);
      if (trials.length) context.logger.warn({ trials }, 'settings trials whose job is gone marked failed');
    },
  });
  boss.once('stopped', () => void presence.stop());
  const withPresence = { ...context, presence };
  await registerImportQueue(boss, withPresence);
  await registerRefitQueues(boss, withPresence);
  await registerSettingsTrialQueue(boss, withPresence);
  await registerMailQueue(boss, { ...withPresence, mailFrom: context.mailFrom ?? 'Loadwright <loadwright@localhost>' });
  await registerDetectionQueues(boss, { ...withPresence, publicUrl: context.publicUrl ?? 'http://127.0.0.1:4280' });
  await registerScoringQueues(boss, withPresence);
  return presence;
}
