import { z } from 'zod';
import { digitsSchema } from './input';

/** A message the local mail catcher received, as listed on the Outbox page. */
export const outboxSummarySchema = z.object({
  id: z.string(),
  receivedAt: z.iso.datetime(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
});

/** One message with both of its parts. */
export const outboxMessageSchema = outboxSummarySchema.extend({ text: z.string(), html: z.string() });

export type OutboxSummary = z.infer<typeof outboxSummarySchema>;
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;

/** What a sent-mail log row is for, and where it stands. */
export const mailKinds = ['invite', 'password_reset', 'miss_alert', 'miss_digest'] as const;
export const mailStatuses = ['queued', 'sent', 'failed'] as const;

/** One row of the sent-mail log: every message the product sent, is still trying to send, or gave up on. */
export const mailLogEntrySchema = z.object({
  id: z.number().int(),
  kind: z.enum(mailKinds),
  recipient: z.string(),
  subject: z.string(),
  status: z.enum(mailStatuses),
  attempts: z.number().int(),
  /** Why the last attempt failed, while queued or failed. */
  lastError: z.string().nullable(),
  queuedAt: z.iso.datetime(),
  lastAttemptAt: z.iso.datetime().nullable(),
  sentAt: z.iso.datetime().nullable(),
});

/** GET /api/mail-log query. */
export const mailLogQuerySchema = z.object({
  status: z.enum(mailStatuses).optional(),
  limit: digitsSchema(1, 500).default(100),
});

/** The log with a line on whether delivery is delayed. */
export const mailLogSchema = z.object({
  delayed: z.boolean(),
  /** Plain words on the delay, when there is one. */
  delayNotice: z.string().nullable(),
  entries: z.array(mailLogEntrySchema),
});

export type MailLogEntry = z.infer<typeof mailLogEntrySchema>;
export type MailLog = z.infer<typeof mailLogSchema>;
