/** The Outbox (admins): the sent-mail log of everything the product sends, and what the local mail catcher received. */
import { mailLogQuerySchema, mailLogSchema, outboxMessageSchema, outboxSummarySchema } from '@loadwright/contracts';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import { HttpProblem } from '@loadwright/problems';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { listCaughtMail, listMailLog, mailDelivery, readCaughtMail } from '@loadwright/mail';

/** The routes under /api/outbox. */
export function outboxRoutes({ outboxFolder, db }: AppContext): RouteDefinition[] {
  const folder = () => {
    if (!outboxFolder)
      throw new HttpProblem(
        'notFound',
        'There is no Outbox: mail goes to the server in SMTP_URL. The Outbox exists only with the local mail catcher.',
      );
    return outboxFolder;
  };
  return [
    defineRoute({
      method: 'get',
      path: '/mail-log',
      access: 'admin.outbox',
      tag: 'Outbox',
      summary: 'The sent-mail log: every message sent, still queued (with why the last attempt failed) or failed, newest first',
      query: mailLogQuerySchema,
      response: mailLogSchema,
      handler: async ({ query }) => {
        const delivery = await mailDelivery(db);
        const rows = await listMailLog(db, query);
        return {
          delayed: delivery.delayed,
          delayNotice: delivery.delayed
            ? `The mail server has not accepted mail since ${delivery.since?.toISOString() ?? 'recently'} (${delivery.lastError ?? 'no answer'}). Queued mail is retried automatically.`
            : null,
          entries: rows.map((row) => ({
            ...row,
            queuedAt: row.queuedAt.toISOString(),
            lastAttemptAt: row.lastAttemptAt?.toISOString() ?? null,
            sentAt: row.sentAt?.toISOString() ?? null,
          })),
        };
      },
    }),
    defineRoute({
      method: 'get',
      path: '/outbox',
      access: 'admin.outbox',
      tag: 'Outbox',
      summary: 'Messages the local mail catcher received, newest first',
      response: z.array(outboxSummarySchema),
      handler: () => listCaughtMail(folder()).map(({ text: _text, html: _html, ...summary }) => summary),
    }),
    defineRoute({
      method: 'get',
      path: '/outbox/:id',
      access: 'admin.outbox',
      tag: 'Outbox',
      summary: 'One caught message with its plain-text and HTML parts',
      params: z.object({ id: z.string().regex(/^[\w-]+$/) }),
      response: outboxMessageSchema,
      handler: ({ params }) => {
        const mail = readCaughtMail(folder(), params.id);
        if (!mail) throw new HttpProblem('notFound', `No caught message ${params.id}.`);
        return mail;
      },
    }),
  ];
}
