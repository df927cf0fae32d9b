/** The sent-mail log as admins read it, and the one-line state of delivery that actions report. */
import { and, desc, eq, gt, sql, type SQL } from 'drizzle-orm';
import { mailMessages, type Database } from '@loadwright/db';

/** Whether mail is going out: delayed when the newest delivery attempt failed and nothing was sent since. */
export interface MailDelivery {
  delayed: boolean;
  /** When attempts started failing. */
  since: Date | null;
  /** The mail server's last answer or the connection error. */
  lastError: string | null;
}

/** Reads whether the mail server is accepting mail, judged by the log's latest attempts. */
export async function mailDelivery(db: Pick<Database, 'select'>): Promise<MailDelivery> {
  const [row] = await db
    .select({
      lastSent: sql<Date | null>`max(${mailMessages.sentAt})`.mapWith((v) => (v ? new Date(v) : null)),
      lastFailed: sql<Date | null>`max(${mailMessages.lastAttemptAt}) filter (where ${mailMessages.status} <> 'sent')`.mapWith((v) =>
        v ? new Date(v) : null,
      ),
      firstFailed:
        sql<Date | null>`min(${mailMessages.lastAttemptAt}) filter (where ${mailMessages.status} = 'queued' and ${mailMessages.attempts} > 0)`.mapWith(
          (v) => (v ? new Date(v) : null),
        ),
    })
    .from(mailMessages);
  const delayed = !!row?.lastFailed && (!row.lastSent || row.lastFailed > row.lastSent);
  if (!delayed) return { delayed: false, since: null, lastError: null };
  const [latest] = await db
    .select({ lastError: mailMessages.lastError })
    .from(mailMessages)
    .where(and(gt(mailMessages.attempts, 0), eq(mailMessages.status, 'queued')))
    .orderBy(desc(mailMessages.lastAttemptAt))
    .limit(1);
  return { delayed: true, since: row.firstFailed ?? row.lastFailed, lastError: latest?.lastError ?? null };
}

/** What an action that queued mail tells the person who took it. */
export function mailNotice(delivery: MailDelivery, what: string, to: string): string {
  if (!delivery.delayed) return `${what} to ${to} is on its way.`;
  return `${what} to ${to} is queued, but delayed: the mail server has not accepted mail since ${delivery.since?.toISOString().slice(11, 16) ?? 'recently'} UTC. It is retried automatically; admins see it in the sent-mail log.`;
}

/** Filters of the sent-mail log. */
export interface MailLogQuery {
  status?: (typeof mailMessages.status.enumValues)[number];
  limit: number;
}

/** The newest log rows first, without their bodies. */
export async function listMailLog(db: Pick<Database, 'select'>, query: MailLogQuery) {
  const where: SQL[] = [];
  if (query.status) where.push(eq(mailMessages.status, query.status));
  return db
    .select({
      id: mailMessages.id,
      kind: mailMessages.kind,
      recipient: mailMessages.recipient,
      subject: mailMessages.subject,
      status: mailMessages.status,
      attempts: mailMessages.attempts,
      lastError: mailMessages.lastError,
      queuedAt: mailMessages.queuedAt,
      lastAttemptAt: mailMessages.lastAttemptAt,
      sentAt: mailMessages.sentAt,
    })
    .from(mailMessages)
    .where(where.length ? and(...where) : undefined)
    .orderBy(desc(mailMessages.queuedAt), desc(mailMessages.id))
    .limit(query.limit);
}
