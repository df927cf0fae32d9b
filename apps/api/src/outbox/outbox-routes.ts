/** The Outbox (admins): the sent-mail log of everything the product sends, and what the local mail catcher received. */
import { mailLogQuerySchema, mailLogSchema, outboxMessageSchema, outboxSummarySchema } from '@loadwright/contracts';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import { HttpProblem } from '@loadwright/problems';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { listCaughtMail, listMailLog, mailDelivery, readCaughtMail } from '@loadwright/mail';
import { createRepeatDamper, recordAudit, type Actor, type AuditEntry } from '@loadwright/audit';
import { clientAddress } from '../auth/client-address';

function actorKey(actor: Actor): string {
  return actor.kind === 'user' ? `user:${actor.userId}` : actor.kind === 'token' ? `token:${actor.tokenId}` : 'anonymous';
}

/** The same person opening the same message (or the list) again within this time adds no audit entry: 10 minutes. */
export const outboxAuditWindowMs = 10 * 60_000;

/** The routes under /api/outbox. */
export function outboxRoutes({ outboxFolder, db }: AppContext): RouteDefinition[] {
  // Caught mail holds invite and reset links that let the reader sign in as someone else, so reading it
  // is audited: who opened which message, and who looked at the list, with repeats folded (a page that
  // polls the list writes one entry per admin every 10 minutes, not one per poll).
  const damper = createRepeatDamper({ windowMs: outboxAuditWindowMs });
  const audit = async (actor: Actor, key: string, entry: Omit<AuditEntry, 'actor'>, ip: string) => {
    const { record, repeatsSinceLast } = damper.decide(`${actorKey(actor)}:${key}`);
    if (!record) return;
    await recordAudit(db, { ...entry, actor, ip, detail: { ...entry.detail, ...(repeatsSinceLast > 0 && { repeatsSinceLast }) } });
  };
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
      handler: async ({ actor, req }) => {
        const messages = listCaughtMail(folder()).map(({ text: _text, html: _html, ...summary }) => summary);
        await audit(actor, 'list', { action: 'outbox.listed', detail: { messages: messages.length } }, clientAddress(req));
        return messages;
      },
    }),
    defineRoute({
      method: 'get',
      path: '/outbox/:id',
      access: 'admin.outbox',
      tag: 'Outbox',
      summary: 'One caught message with its plain-text and HTML parts',
      params: z.object({ id: z.string().regex(/^[\w-]+$/) }),
      response: outboxMessageSchema,
      handler: async ({ params, actor, req }) => {
        const mail = readCaughtMail(folder(), params.id);
        if (!mail) throw new HttpProblem('notFound', `No caught message ${params.id}.`);
        await audit(
          actor,
          `message:${params.id}`,
          { action: 'outbox.message_read', targetType: 'mail', targetId: params.id, detail: { subject: mail.subject, to: mail.to } },
          clientAddress(req),
        );
        return mail;
      },
    }),
  ];
}
