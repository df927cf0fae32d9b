/**
 * The 'send-mail' handler: delivers sent-mail log rows through SMTP one at a time, in the order they
 * were queued (a resent invitation arrives after the one it replaces). A mail
 * server that refuses or is unreachable fails the job, which pg-boss retries with doubling delays;
 * the log row shows the attempts and the last error meanwhile. A sweep once a minute gives a job to
 * any log row left queued without one, so no message waits forever.
 */
import pg from 'pg';
import type PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import {
  createMailer,
  createMailQueue,
  deliverMail,
  enqueueMailJobs,
  sendMailQueue,
  strandedMail,
  type Mailer,
  type SendMailJob,
} from '@loadwright/mail';
import { drizzle } from 'drizzle-orm/node-postgres';

/** What the mail handler needs from the worker. */
export interface MailWorkerContext {
  logger: Logger;
  databaseUrl: string;
  /** The mail server; without one the queue is created but nothing is delivered (mail waits, logged as queued). */
  smtpUrl?: string;
  /** Sender when the organisation has set none. */
  mailFrom: string;
}

/** The sender: the organisation's address from Settings, else the worker's MAIL_FROM. */
async function senderOf(pool: pg.Pool, fallback: string): Promise<string> {
  const { rows } = await pool.query<{ mail_from: string }>('select mail_from from organisation limit 1');
  return rows[0]?.mail_from ?? fallback;
}

/** Creates the queue and starts the handler and the sweep; both stop with pg-boss. */
export async function registerMailQueue(boss: PgBoss, context: MailWorkerContext): Promise<void> {
  const { logger } = context;
  const pool = new pg.Pool({
    connectionString: context.databaseUrl,
    max: 3,
    application_name: 'loadwright-mail',
    idleTimeoutMillis: 5_000,
  });
  pool.on('error', (error) => logger.warn({ err: error }, 'mail database connection lost'));
  await createMailQueue(boss);
  const sweep = async () => {
    const ids = await strandedMail(pool, sendMailQueue);
    if (ids.length === 0) return;
    await enqueueMailJobs(drizzle(pool), ids);
    logger.info({ count: ids.length }, 'queued mail without a delivery job given one');
  };
  await sweep().catch((error) => logger.warn({ err: error }, 'mail sweep failed'));
  const timer = setInterval(() => void sweep().catch((error) => logger.warn({ err: error }, 'mail sweep failed')), 60_000);
  timer.unref();
  boss.once('stopped', () => {
    clearInterval(timer);
    void pool.end().catch(() => {});
  });
  if (!context.smtpUrl) {
    logger.warn('SMTP_URL is not set: mail stays queued in the sent-mail log until a worker with a mail server starts');
    return;
  }
  const smtpUrl = context.smtpUrl;
  let mailer: { from: string; mailer: Mailer } | undefined;
  const mailerFor = (from: string) => {
    if (mailer?.from !== from) mailer = { from, mailer: createMailer(smtpUrl, from) };
    return mailer.mailer;
  };
  await boss.work<SendMailJob>(sendMailQueue, { batchSize: 1, includeMetadata: true, pollingIntervalSeconds: 0.5 }, async (jobs) => {
    const from = await senderOf(pool, context.mailFrom);
    const results = await Promise.allSettled(
      jobs.map((job) => deliverMail(pool, mailerFor(from), job.data.messageId, { retryCount: job.retryCount, retryLimit: job.retryLimit })),
    );
    for (const [i, result] of results.entries()) {
      const job = jobs[i]!;
      if (result.status === 'fulfilled') {
        logger.debug({ messageId: job.data.messageId, outcome: result.value }, 'mail delivered');
        continue;
      }
      logger.warn(
        { messageId: job.data.messageId, err: result.reason, retryCount: job.retryCount },
        'mail delivery failed; the queue retries it',
      );
      await boss.fail(sendMailQueue, job.id, { message: result.reason instanceof Error ? result.reason.message : String(result.reason) });
    }
  });
}
