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
import type { Actor } from '@loadwright/audit';
import { hashApiToken } from './api-token-secret';
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

/** The gatekeeper used by every declared route. */
export function createGatekeeper({ db, secret, secureCookies }: GatekeeperOptions): Gatekeeper {
  async function identifyToken(token: string): Promise<Actor> {
    const [row] = await db
      .select({ id: apiTokens.id, name: apiTokens.name, scope: apiTokens.scope, lastUsedAt: apiTokens.lastUsedAt })
      .from(apiTokens)
      .where(
        and(
          eq(apiTokens.secretHash, hashApiToken(token)),
          isNull(apiTokens.revokedAt),
          sql`(${apiTokens.expiresAt} IS NULL OR ${apiTokens.expiresAt} > now())`,
        ),
      );
    if (!row) return { kind: 'anonymous', reason: 'The API token is unknown, revoked or expired.' };
    // Record use at most once a minute: enough for "last used", without a write per request.
    if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() > 60_000) {
      await db.update(apiTokens).set({ lastUsedAt: new Date() }).where(eq(apiTokens.id, row.id));
    }
    return { kind: 'token', tokenId: row.id, name: row.name, scope: row.scope };
  }

  async function identifySession(token: string, res: Response): Promise<Actor> {
    const claims = await verifySessionToken(secret, token);
    if (!claims) return { kind: 'anonymous', reason: 'Your session has ended. Sign in again.' };
    const [row] = await db
      .select({ userId: users.id, email: users.email, displayName: users.displayName, role: users.role, lastSeenAt: sessions.lastSeenAt })
      .from(sessions)
      .innerJoin(users, eq(users.id, sessions.userId))
      .where(
        and(eq(sessions.id, claims.sessionId), isNull(sessions.revokedAt), gt(sessions.expiresAt, sql`now()`), eq(users.active, true)),
      );
    if (!row || row.userId !== claims.userId) return { kind: 'anonymous', reason: 'Your session has ended. Sign in again.' };
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
        throw new HttpProblem('forbidden', 'The request is missing its CSRF token. Reload the page and try again.');
      }
    },
  };
}
