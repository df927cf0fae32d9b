/** The People page's API (admins): list, invite, change role, deactivate and reactivate, resend invites. */
import { and, asc, eq, ne, sql } from 'drizzle-orm';
import {
  idParamsSchema,
  inviteRequestSchema,
  inviteResponseSchema,
  messageResponseSchema,
  personSchema,
  updatePersonRequestSchema,
} from '@loadwright/contracts';
import { users, type Database } from '@loadwright/db';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import type { Actor } from '@loadwright/audit';
import { recordAudit } from '@loadwright/audit';
import { clientAddress } from '../auth/client-address';
import { issueLink, linkLifetimes } from '../auth/one-time-links';
import { revokeSessionsOf } from '../auth/session-service';
import { HttpProblem } from '@loadwright/problems';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { inviteMessage, mailDelivery, mailNotice, queueMail, type MailWriter } from '@loadwright/mail';

const idParams = idParamsSchema;

type UserRow = typeof users.$inferSelect;

function toPerson(user: UserRow) {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    active: user.active,
    invitePending: user.passwordHash === null,
    createdAt: user.createdAt.toISOString(),
    lastSignInAt: user.lastSignInAt?.toISOString() ?? null,
  };
}

/** The routes under /api/people. */
export function peopleRoutes(context: AppContext): RouteDefinition[] {
  const { db } = context;

  /** Issues a fresh link and queues its mail, in the caller's transaction (the mail exists exactly when the link does). */
  const queueInvite = async (tx: MailWriter & Pick<Database, 'update'>, user: UserRow, actor: Actor) => {
    const secret = await issueLink(tx, user.id, 'invite', actor.kind === 'user' ? actor.userId : null);
    const link = `${context.publicUrl}/set-password?token=${encodeURIComponent(secret)}`;
    const invitedBy = actor.kind === 'user' ? actor.displayName : 'An administrator';
    const message = inviteMessage(user.email, user.displayName, invitedBy, link, linkLifetimes.invite / 60);
    await queueMail(tx, [{ ...message, kind: 'invite', userId: user.id }]);
  };

  return [
    defineRoute({
      method: 'get',
      path: '/people',
      access: 'admin.people',
      tag: 'People',
      summary: 'Everyone who can sign in, active or not',
      response: z.array(personSchema),
      handler: async () => (await db.select().from(users).orderBy(asc(users.displayName))).map(toPerson),
    }),
    defineRoute({
      method: 'post',
      path: '/people',
      access: 'admin.people',
      tag: 'People',
      summary: 'Invite someone: creates the account and queues an e-mail with a one-time set-password link',
      body: inviteRequestSchema,
      response: inviteResponseSchema,
      status: 201,
      handler: async ({ body, actor, req }) => {
        const [existing] = await db
          .select({ id: users.id })
          .from(users)
          .where(eq(sql`lower(${users.email})`, body.email.toLowerCase()));
        if (existing)
          throw new HttpProblem('conflict', `${body.email} already has an account.`, [
            { pointer: '/email', detail: 'Already has an account' },
          ]);
        const user = await db.transaction(async (tx) => {
          const [row] = await tx
            .insert(users)
            .values({ email: body.email, displayName: body.displayName, role: body.role, passwordHash: null })
            .returning();
          await recordAudit(tx, {
            actor,
            action: 'user.invited',
            targetType: 'user',
            targetId: row!.id,
            detail: { email: body.email, role: body.role },
            ip: clientAddress(req),
          });
          await queueInvite(tx, row!, actor);
          return row!;
        });
        return { ...toPerson(user), mailNotice: mailNotice(await mailDelivery(db), 'The invitation', user.email) };
      },
    }),
    defineRoute({
      method: 'patch',
      path: '/people/:id',
      access: 'admin.people',
      tag: 'People',
      summary: 'Change role or name, deactivate or reactivate; role changes and deactivation end sessions at once',
      params: idParams,
      body: updatePersonRequestSchema,
      response: personSchema,
      handler: async ({ params, body, actor, req }) => {
        const updated = await db.transaction(async (tx) => {
          const [user] = await tx.select().from(users).where(eq(users.id, params.id)).for('update');
          if (!user) throw new HttpProblem('notFound', `No person with id ${params.id}.`);
          const losesAdmin =
            user.role === 'admin' && user.active && ((body.role !== undefined && body.role !== 'admin') || body.active === false);
          if (losesAdmin) {
            const [{ count }] = (await tx
              .select({ count: sql<number>`count(*)::int` })
              .from(users)
              .where(and(eq(users.role, 'admin'), eq(users.active, true), ne(users.id, user.id)))) as [{ count: number }];
            if (count === 0) throw new HttpProblem('conflict', 'This is the last active admin. Make someone else an admin first.');
          }
          const [row] = await tx.update(users).set(body).where(eq(users.id, user.id)).returning();
          const roleChanged = body.role !== undefined && body.role !== user.role;
          const deactivated = body.active === false && user.active;
          if (roleChanged || deactivated) await revokeSessionsOf(tx, user.id);
          const changes = Object.fromEntries(
            Object.entries(body).map(([key, value]) => [key, { from: user[key as keyof typeof body], to: value }]),
          );
          await recordAudit(tx, {
            actor,
            action: roleChanged
              ? 'user.role_changed'
              : deactivated
                ? 'user.deactivated'
                : body.active
                  ? 'user.reactivated'
                  : 'user.updated',
            targetType: 'user',
            targetId: user.id,
            detail: changes,
            ip: clientAddress(req),
          });
          return row!;
        });
        return toPerson(updated);
      },
    }),
    defineRoute({
      method: 'post',
      path: '/people/:id/invite',
      access: 'admin.people',
      tag: 'People',
      summary: 'Send a fresh invite link to someone who has not set a password yet',
      params: idParams,
      response: messageResponseSchema,
      handler: async ({ params, actor, req }) => {
        const [user] = await db.select().from(users).where(eq(users.id, params.id));
        if (!user) throw new HttpProblem('notFound', `No person with id ${params.id}.`);
        if (user.passwordHash !== null)
          throw new HttpProblem('conflict', `${user.displayName} has already set a password; they can use "Forgot password" instead.`);
        await db.transaction(async (tx) => {
          await queueInvite(tx, user, actor);
          await recordAudit(tx, { actor, action: 'user.invite_resent', targetType: 'user', targetId: user.id, ip: clientAddress(req) });
        });
        return { message: mailNotice(await mailDelivery(db), 'A new invite link', user.email) };
      },
    }),
  ];
}
