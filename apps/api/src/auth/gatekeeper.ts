/**
 * Identifies the caller of each request: a bearer API token, else the session cookie, else nobody.
 * A session is only as good as its row: revoked, expired, or belonging to a deactivated person means
 * anonymous. The cookie is renewed while the session lives, so active people stay signed in.
 */
import { and, eq, gt, isNull, sql } from 'drizzle-orm';
import type { Request, Response } from 'express';
import { apiTokens, sessions, users, type Database } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';
import type { Gatekeeper } from '../http/mount-routes';
import { createRepeatDamper, recordAudit, type Actor, type RefusedCredential } from '@loadwright/audit';
import { hashApiToken } from './api-token-secret';
import { clientAddress } from './client-address';
import { isValidCsrfToken, csrfHeaderName } from './csrf';
import { sessionTokenTtlSeconds, verifySessionToken } from './session-token';
import { sessionCookieName, setSessionCookies } from './session-cookies';

/** What identification needs. */
export interface GatekeeperOptions {
  db: Database;
  secret: Uint8Array;
  /** Mark cookies Secure (when served over HTTPS). */
  secureCookies: boolean;
}

/** How long repeats of one refusal (same caller, same cause) are counted instead of written: 10 minutes. */
export const refusalAuditWindowMs = 10 * 60_000;

/**
 * The two lookups every authenticated request makes, as named prepared statements: PostgreSQL parses
 * and plans each once per connection and Drizzle builds its SQL once per process, instead of both on
 * every request (together most of a cached forecast review's CPU). They still read the rows on every
 * request, so a revoked session or token stops working at once, whichever process revoked it.
 */
function credentialLookups(db: Database) {
  const token = db
    .select({
      id: apiTokens.id,
      name: apiTokens.name,
      scope: apiTokens.scope,
      lastUsedAt: apiTokens.lastUsedAt,
      revokedAt: apiTokens.revokedAt,
      expired: sql<boolean>`(${apiTokens.expiresAt} IS NOT NULL AND ${apiTokens.expiresAt} <= now())`,
      creatorId: users.id,
      creatorRole: users.role,
      creatorActive: users.active,
    })
    .from(apiTokens)
    .leftJoin(users, eq(users.id, apiTokens.createdById))
    .where(eq(apiTokens.secretHash, sql.placeholder('secretHash')))
    .prepare('loadwright_token_by_hash');
  const session = db
    .select({ userId: users.id, email: users.email, displayName: users.displayName, role: users.role, lastSeenAt: sessions.lastSeenAt })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(
      and(
        eq(sessions.id, sql.placeholder('sessionId')),
        isNull(sessions.revokedAt),
        gt(sessions.expiresAt, sql`now()`),
        eq(users.active, true),
      ),
    )
    .prepare('loadwright_live_session');
  return { token, session };
}

/** The gatekeeper used by every declared route. */
export function createGatekeeper({ db, secret, secureCookies }: GatekeeperOptions): Gatekeeper {
  const damper = createRepeatDamper({ windowMs: refusalAuditWindowMs });
  const lookups = credentialLookups(db);
  async function identifyToken(token: string): Promise<Actor> {
    const [row] = await lookups.token.execute({ secretHash: hashApiToken(token) });
    const refuse = (cause: RefusedCredential['cause'], reason: string): Actor => ({
      kind: 'anonymous',
      reason,
      refused: { credential: 'token', cause, ...(row && { tokenId: row.id }) },
    });
    if (!row) return refuse('unknown', 'The API token is unknown, revoked or expired.');
    if (row.revokedAt) return refuse('revoked', 'The API token is unknown, revoked or expired.');
    if (row.expired) return refuse('expired', 'The API token is unknown, revoked or expired.');
    // A token acts for its creator: it stops when they are deactivated (or gone), and never exceeds their role.
    if (row.creatorId === null || row.creatorRole === null || !row.creatorActive)
      return refuse('creator inactive', 'The API token stopped working because the person who created it is no longer active.');
    // Record use at most once a minute: enough for "last used", without a write per request.
    if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() > 60_000) {
      await db.update(apiTokens).set({ lastUsedAt: new Date() }).where(eq(apiTokens.id, row.id));
    }
    return { kind: 'token', tokenId: row.id, name: row.name, scope: row.scope, creator: { userId: row.creatorId, role: row.creatorRole } };
  }

  async function identifySession(token: string, res: Response): Promise<Actor> {
    const claims = await verifySessionToken(secret, token);
    const ended: Actor = {
      kind: 'anonymous',
      reason: 'Your session has ended. Sign in again.',
      refused: { credential: 'session', cause: 'ended' },
    };
    if (!claims) return ended;
    const [row] = await lookups.session.execute({ sessionId: claims.sessionId });
    if (!row || row.userId !== claims.userId) return ended;
    const secondsLeft = claims.expiresAt - Date.now() / 1000;
    if (secondsLeft < sessionTokenTtlSeconds / 2) {
      await setSessionCookies(res, { secret, secure: secureCookies, sessionId: claims.sessionId, userId: row.userId });
      await db.update(sessions).set({ lastSeenAt: new Date() }).where(eq(sessions.id, claims.sessionId));
    }
    return {
      kind: 'user',
      userId: row.userId,
      email: row.email,
      displayName: row.displayName,
      role: row.role,
      sessionId: claims.sessionId,
    };
  }

  return {
    async identify(req, res) {
      const authorization = req.headers.authorization;
      if (authorization?.startsWith('Bearer ')) return identifyToken(authorization.slice('Bearer '.length).trim());
      const cookie = (req.cookies as Record<string, string> | undefined)?.[sessionCookieName];
      return cookie ? identifySession(cookie, res) : { kind: 'anonymous' };
    },
    assertCsrf(req: Request, actor: Actor) {
      if (actor.kind !== 'user') return;
      const presented = req.headers[csrfHeaderName];
      if (!isValidCsrfToken(secret, actor.sessionId, typeof presented === 'string' ? presented : undefined)) {
        throw new HttpProblem('forbidden', 'The request is missing its CSRF token. Reload the page and try again.', undefined, 'csrf');
      }
    },
    async recordRefusal(req, actor, problem, route) {
      const ip = clientAddress(req);
      const refusal = describeRefusal(actor, problem, route, ip);
      if (!refusal) return;
      const { record, repeatsSinceLast } = damper.decide(refusal.key);
      if (!record) return;
      await recordAudit(db, {
        actor,
        action: refusal.action,
        targetType: refusal.targetType,
        targetId: refusal.targetId,
        detail: { ...refusal.detail, status: problem.toProblem().status, ...(repeatsSinceLast > 0 && { repeatsSinceLast }) },
        ip,
      });
    },
  };
}

/** What an audit entry says about a refused call; null for refusals not worth an entry. */
function describeRefusal(
  actor: Actor,
  problem: HttpProblem,
  route: { method: string; path: string },
  ip: string,
): { key: string; action: string; targetType?: string; targetId?: number; detail: Record<string, unknown> } | null {
  const call = `${route.method.toUpperCase()} /api${route.path}`;
  if (problem.reason === 'csrf' && actor.kind === 'user')
    return { key: `csrf:${actor.sessionId}`, action: 'access.csrf_refused', detail: { route: call } };
  if (actor.kind === 'anonymous') {
    // A visitor with no credentials at all (the sign-in page asking who is signed in) is not worth an entry.
    if (!actor.refused) return null;
    const { credential, cause, tokenId } = actor.refused;
    if (credential === 'token')
      return {
        key: `token:${tokenId ?? ip}:${cause}`,
        action: 'token.refused',
        targetType: tokenId === undefined ? undefined : 'api_token',
        targetId: tokenId,
        detail: { cause, route: call },
      };
    return { key: `session:${ip}`, action: 'access.denied', detail: { cause: 'session ended', route: call } };
  }
  const who = actor.kind === 'user' ? `user:${actor.userId}` : `token:${actor.tokenId}`;
  return { key: `${who}:${call}`, action: 'access.denied', detail: { route: call, reason: problem.detail } };
}
