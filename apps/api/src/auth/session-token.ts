/**
 * The session cookie: a short-lived JWT (HS256, signed with jose) naming the server-side session row.
 * The signature stops forgery; the row, checked on every request, lets sign-out, deactivation and role
 * changes end a session at once.
 */
import { SignJWT, jwtVerify } from 'jose';

/** The cookie's lifetime; it is renewed while the session row lives and the person is active. */
export const sessionTokenTtlSeconds = 30 * 60;
/** A session ends after this long however active it is, and the person signs in again. */
export const sessionMaxAgeSeconds = 12 * 60 * 60;

const issuer = 'loadwright';
const audience = 'loadwright-web';

/** The claims we rely on. */
export interface SessionClaims {
  sessionId: string;
  userId: number;
  /** Seconds since the epoch when the token expires. */
  expiresAt: number;
}

/** Signs a token for a session. */
export async function signSessionToken(secret: Uint8Array, sessionId: string, userId: number): Promise<string> {
  return new SignJWT({ sid: sessionId })
    .setProtectedHeader({ alg: 'HS256' })
    .setSubject(String(userId))
    .setIssuer(issuer)
    .setAudience(audience)
    .setIssuedAt()
    .setExpirationTime(`${sessionTokenTtlSeconds}s`)
    .sign(secret);
}

/** Verifies a token's signature, issuer, audience and expiry; null when any fails. */
export async function verifySessionToken(secret: Uint8Array, token: string): Promise<SessionClaims | null> {
  try {
    const { payload } = await jwtVerify(token, secret, { issuer, audience, algorithms: ['HS256'] });
    if (typeof payload['sid'] !== 'string' || !payload.sub || !payload.exp) return null;
    return { sessionId: payload['sid'], userId: Number(payload.sub), expiresAt: payload.exp };
  } catch {
    return null;
  }
}
