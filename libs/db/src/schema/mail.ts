import { sql } from 'drizzle-orm';
import { bigint, check, index, integer, pgEnum, pgTable, smallint, text } from 'drizzle-orm/pg-core';
import { users } from './people';
import { instant } from './timestamps';

/** What a message is for: the product's own mail, one kind each. */
export const mailKind = pgEnum('mail_kind', ['invite', 'password_reset', 'miss_alert', 'miss_digest']);

/** Where a message stands: waiting for (another) delivery attempt, handed to the mail server, or given up. */
export const mailStatus = pgEnum('mail_status', ['queued', 'sent', 'failed']);

/**
 * The sent-mail log: every message the product sends, written in the transaction of what caused it
 * (an invitation, a reset, a miss) together with its 'send-mail' job. The job delivers it with
 * retries; the row says whether it was sent, is still queued (and why the last attempt failed) or
 * failed for good. Nothing is ever sent without a row here.
 */
export const mailMessages = pgTable(
  'mail_messages',
  {
    id: bigint('id', { mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
    kind: mailKind('kind').notNull(),
    recipient: text('recipient').notNull(),
    /** The person it is addressed to, when it is one of ours. */
    userId: integer('user_id').references(() => users.id, { onDelete: 'set null' }),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    html: text('html').notNull(),
    status: mailStatus('status').notNull().default('queued'),
    attempts: smallint('attempts').notNull().default(0),
    /** Why the last attempt failed (the mail server's answer or the connection error). */
    lastError: text('last_error'),
    queuedAt: instant('queued_at').notNull().defaultNow(),
    lastAttemptAt: instant('last_attempt_at'),
    sentAt: instant('sent_at'),
  },
  (t) => [
    index('mail_messages_queued_idx').on(t.queuedAt.desc()),
    index('mail_messages_status_idx')
      .on(t.status, t.queuedAt)
      .where(sql`${t.status} <> 'sent'`),
    check('mail_messages_sent_check', sql`(${t.status} = 'sent') = (${t.sentAt} is not null)`),
  ],
);
