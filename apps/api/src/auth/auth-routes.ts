/** Sign-in, sign-out, the current session, and passwords (own change, forgotten, from a link). */
import { eq, sql } from 'drizzle-orm';
import {
  changePasswordRequestSchema,
  forgotPasswordRequestSchema,
  messageResponseSchema,
  sessionInfoSchema,
  setPasswordRequestSchema,
  signInRequestSchema,
} from '@loadwright/contracts';
import { users } from '@loadwright/db';
import type { AppContext } from '../app-context';
import { recordAudit, type Actor } from '@loadwright/audit';
import { HttpProblem } from '@loadwright/problems';
import { passwordResetMessage, queueMail } from '@loadwright/mail';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { clientAddress } from './client-address';
import { issueLink, issuedRecently, linkLifetimes, redeemLink } from './one-time-links';
import { hashPassword, verifyPassword } from './passwords';
import { openSession, revokeSession, revokeSessionsOf, sessionInfo } from './session-service';
import { clearSessionCookies, setSessionCookies } from './session-cookies';
import { clearFailures, describeWait, recordFailure, secondsToWait } from './sign-in-throttle';

const wrongCredentials = 'The e-mail address or password is not right.';

/** The routes under /api/auth. */
export function authRoutes(context: AppContext): RouteDefinition[] {
  const { db, sessionSecret, secureCookies } = context;

  const findUserByEmail = async (email: string) => {
    const [user] = await db
      .select()
      .from(users)
      .where(eq(sql`lower(${users.email})`, email.toLowerCase()));
    return user;
  };

  /**
   * Issues a reset link to an active account and queues its mail with the audit entry in one
   * transaction, at most one every two minutes so the form cannot flood an inbox.
   */
  const sendResetLink = async (email: string, actor: Actor, ip: string) => {
    const user = await findUserByEmail(email);
    if (!user?.active) return;
    await db.transaction(async (tx) => {
      // Two requests at once must not both pass the two-minute check: one waits for the other's link.
      await tx.execute(sql`select pg_advisory_xact_lock(hashtext('password-reset'), ${user.id})`);
      if (await issuedRecently(tx, user.id, 'password_reset', 2)) return;
      const secret = await issueLink(tx, user.id, 'password_reset', null);
      const link = `${context.publicUrl}/set-password?token=${encodeURIComponent(secret)}`;
      const message = passwordResetMessage(user.email, user.displayName, link, linkLifetimes.password_reset);
      await queueMail(tx, [{ ...message, kind: 'password_reset', userId: user.id }]);
      await recordAudit(tx, { actor, action: 'user.password_reset_requested', targetType: 'user', targetId: user.id, ip });
    });
  };

  return [
    defineRoute({
      method: 'post',
      path: '/auth/sign-in',
      access: 'public',
      tag: 'Sign-in',
      summary: 'Sign in with e-mail and password; sets the session and CSRF cookies',
      body: signInRequestSchema,
      response: sessionInfoSchema,
      handler: async ({ body, req, res, actor }) => {
        const ip = clientAddress(req);
        const email = body.email.toLowerCase();
        const subjects = [
          { kind: 'account' as const, value: email },
          { kind: 'address' as const, value: ip },
        ];
        const wait = await secondsToWait(db, subjects);
        if (wait > 0) {
          await recordAudit(db, { actor, action: 'session.sign_in_delayed', detail: { email, waitSeconds: wait }, ip });
          res.setHeader('Retry-After', String(wait));
          throw new HttpProblem('tooManyAttempts', `Too many failed sign-ins. Try again in ${describeWait(wait)}, or reset your password.`);
        }
        const user = await findUserByEmail(email);
        const passwordMatches = await verifyPassword(user?.passwordHash, body.password);
        if (!user || !passwordMatches || !user.active) {
          await recordFailure(db, subjects);
          await recordAudit(db, {
            actor,
            action: 'session.sign_in_failed',
            targetType: user ? 'user' : undefined,
            targetId: user?.id,
            detail: { email },
            ip,
          });
          throw new HttpProblem('unauthenticated', wrongCredentials);
        }
        await clearFailures(db, subjects[0]!);
        const sessionId = await db.transaction(async (tx) => {
          const opened = await openSession(tx, user.id, ip, req.headers['user-agent']);
          await recordAudit(tx, {
            actor: { kind: 'user', userId: user.id, email: user.email, displayName: user.displayName, role: user.role, sessionId: opened },
            action: 'session.signed_in',
            ip,
          });
          return opened;
        });
        await setSessionCookies(res, { secret: sessionSecret, secure: secureCookies, sessionId, userId: user.id });
        return sessionInfo(user);
      },
    }),
    defineRoute({
      method: 'post',
      path: '/auth/sign-out',
      access: 'self.manage',
      tag: 'Sign-in',
      summary: 'End the current session at once',
      handler: async ({ actor, req, res }) => {
        if (actor.kind !== 'user') throw new HttpProblem('forbidden', 'Only a signed-in person can sign out.');
        await db.transaction(async (tx) => {
          await revokeSession(tx, actor.sessionId);
          await recordAudit(tx, { actor, action: 'session.signed_out', ip: clientAddress(req) });
        });
        clearSessionCookies(res, secureCookies);
      },
    }),
    defineRoute({
      method: 'get',
      path: '/auth/session',
      access: 'self.manage',
      tag: 'Sign-in',
      summary: 'Who is signed in, and what they may do',
      response: sessionInfoSchema,
      handler: ({ actor }) => {
        if (actor.kind !== 'user') throw new HttpProblem('forbidden', 'API tokens have no session.');
        return sessionInfo({ id: actor.userId, email: actor.email, displayName: actor.displayName, role: actor.role });
      },
    }),
    defineRoute({
      method: 'post',
      path: '/auth/password',
      access: 'self.manage',
      tag: 'Sign-in',
      summary: 'Change your own password; ends your other sessions',
      body: changePasswordRequestSchema,
      response: messageResponseSchema,
      handler: async ({ actor, body, req }) => {
        if (actor.kind !== 'user') throw new HttpProblem('forbidden', 'Only a signed-in person can change a password.');
        const [user] = await db.select().from(users).where(eq(users.id, actor.userId));
        if (!(await verifyPassword(user?.passwordHash, body.currentPassword))) {
          throw new HttpProblem('invalidInput', 'Your current password is not right.', [
            { pointer: '/currentPassword', detail: 'Not your current password' },
          ]);
        }
        const passwordHash = await hashPassword(body.newPassword);
        await db.transaction(async (tx) => {
          await tx.update(users).set({ passwordHash }).where(eq(users.id, actor.userId));
          await revokeSessionsOf(tx, actor.userId, actor.sessionId);
          await recordAudit(tx, {
            actor,
            action: 'user.password_changed',
            targetType: 'user',
            targetId: actor.userId,
            ip: clientAddress(req),
          });
        });
        return { message: 'Password changed. Your other sessions were signed out.' };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/auth/forgot-password',
      access: 'public',
      tag: 'Sign-in',
      summary: 'E-mail a password reset link (the answer is the same whether or not the address is known)',
      body: forgotPasswordRequestSchema,
      response: messageResponseSchema,
      handler: ({ body, actor, req }) => {
        const ip = clientAddress(req);
        // The answer leaves before any lookup or mail: the same words, status and timing whether the
        // address is known, unknown, inactive, just sent a link, or the mail server is down.
        void sendResetLink(body.email, actor, ip).catch((error: unknown) =>
          context.logger.warn({ err: error }, 'password reset mail could not be sent'),
        );
        return { message: 'If that address belongs to an active account, a reset link is on its way. It expires in 30 minutes.' };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/auth/set-password',
      access: 'public',
      tag: 'Sign-in',
      summary: 'Set a password from an invite or reset link (single use, expires)',
      body: setPasswordRequestSchema,
      response: messageResponseSchema,
      handler: async ({ body, actor, req }) => {
        const passwordHash = await hashPassword(body.newPassword);
        const outcome = await db.transaction(async (tx) => {
          const link = await redeemLink(tx, body.token);
          if (!link) return null;
          const [user] = await tx.update(users).set({ passwordHash }).where(eq(users.id, link.userId)).returning({ email: users.email });
          await revokeSessionsOf(tx, link.userId);
          // Proving control of the mailbox lifts the account's sign-in wait: the wait message tells people to reset.
          await clearFailures(tx, { kind: 'account', value: user!.email.toLowerCase() });
          await recordAudit(tx, {
            actor,
            action: link.purpose === 'invite' ? 'user.invite_accepted' : 'user.password_reset',
            targetType: 'user',
            targetId: link.userId,
            ip: clientAddress(req),
          });
          return link;
        });
        if (!outcome)
          throw new HttpProblem('invalidInput', 'This link has expired or was already used. Ask for a new one.', [
            { pointer: '/token', detail: 'Expired or already used' },
          ]);
        return { message: 'Password set. You can sign in now.' };
      },
    }),
  ];
}
