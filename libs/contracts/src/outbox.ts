import { z } from 'zod';

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
