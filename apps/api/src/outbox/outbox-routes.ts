/** The Outbox (admins, development): what the local mail catcher received. */
import { outboxMessageSchema, outboxSummarySchema } from '@loadwright/contracts';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import { HttpProblem } from '@loadwright/problems';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { listCaughtMail, readCaughtMail } from '@loadwright/mail';

/** The routes under /api/outbox. */
export function outboxRoutes({ outboxFolder }: AppContext): RouteDefinition[] {
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
