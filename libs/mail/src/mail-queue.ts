/**
 * The 'send-mail' queue: all product mail (invitations, password resets, miss alerts and digests)
 * is written to the sent-mail log and given one job in the transaction of whatever caused it, so a
 * mail server that is down delays a message, never loses it and never fails the action that sent it.
 */
import { ensureQueue, insertJobs, mailMessages, type Database } from '@loadwright/db';
import type PgBoss from 'pg-boss';
import type { MailMessage } from './mailer';

/** Queue of deliveries: data SendMailJob. */
export const sendMailQueue = 'send-mail';

/** Data of a 'send-mail' job: the sent-mail log row to deliver. */
export interface SendMailJob {
  messageId: number;
}

/** What a message is for (the mail_kind enum). */
export type MailKind = (typeof mailMessages.kind.enumValues)[number];

/**
 * Retries from MAIL_RETRY_LIMIT and MAIL_RETRY_DELAY_SECONDS (defaults 12 and 30 s). With backoff
 * pg-boss 10 waits between delay × 2^(n-1) and delay × 2^n after the n-th failure, so 12 retries span
 * 34 to 68 hours: a weekend-long mail outage still delivers. A job running past two minutes (a worker
 * killed mid-delivery) is taken again.
 */
export function mailQueueOptions(env: NodeJS.ProcessEnv = process.env): Omit<PgBoss.Queue, 'name'> {
  const limit = Number(env['MAIL_RETRY_LIMIT'] ?? 12);
  const delay = Number(env['MAIL_RETRY_DELAY_SECONDS'] ?? 30);
  return {
    retryLimit: Number.isInteger(limit) && limit >= 0 ? limit : 12,
    retryDelay: Number.isFinite(delay) && delay >= 1 ? delay : 30,
    retryBackoff: true,
    expireInSeconds: 120,
  };
}

/** Creates the queue, or brings its settings up to date. */
export async function createMailQueue(boss: PgBoss): Promise<void> {
  await ensureQueue(boss, sendMailQueue, mailQueueOptions());
}

/** A database or a transaction: anything that can insert and run SQL. */
export type MailWriter = Pick<Database, 'insert' | 'execute'>;

/** A message to queue, with what it is for and (when one of ours) whom it is for. */
export interface QueuedMail extends MailMessage {
  kind: MailKind;
  userId?: number | null;
}

/** Adds 'send-mail' jobs for log rows on the caller's connection (inside its transaction when it is in one). */
export async function enqueueMailJobs(db: Pick<Database, 'execute'>, messageIds: number[]): Promise<void> {
  if (messageIds.length === 0) return;
  const jobs: PgBoss.JobInsert<SendMailJob>[] = messageIds.map((messageId) => ({
    name: sendMailQueue,
    data: { messageId },
    singletonKey: `mail-${messageId}`,
  }));
  await insertJobs(db, jobs);
}

/**
 * Writes messages to the sent-mail log as queued and adds their delivery jobs, all on `db` (pass the
 * caller's transaction so the mail exists exactly when what caused it commits). Returns the log ids.
 * Before any worker has created the queue the job insert adds nothing; the worker's sweep then
 * queues every log row still waiting without a job.
 */
export async function queueMail(db: MailWriter, messages: QueuedMail[]): Promise<number[]> {
  if (messages.length === 0) return [];
  const rows = await db
    .insert(mailMessages)
    .values(
      messages.map((m) => ({ kind: m.kind, recipient: m.to, userId: m.userId ?? null, subject: m.subject, text: m.text, html: m.html })),
    )
    .returning({ id: mailMessages.id });
  const ids = rows.map((row) => row.id);
  await enqueueMailJobs(db, ids);
  return ids;
}
