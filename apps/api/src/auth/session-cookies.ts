/** Setting and clearing the session and CSRF cookies. */
import type { Response } from 'express';
import { csrfCookieName, csrfTokenFor } from './csrf';
import { sessionTokenTtlSeconds, signSessionToken } from './session-token';

/** Name of the httpOnly cookie carrying the signed session token. */
export const sessionCookieName = 'lw_session';

/** Issues a fresh session token cookie (httpOnly, SameSite=Strict) and the matching CSRF cookie. */
export async function setSessionCookies(
  res: Response,
  { secret, secure, sessionId, userId }: { secret: Uint8Array; secure: boolean; sessionId: string; userId: number },
): Promise<void> {
  const token = await signSessionToken(secret, sessionId, userId);
  const common = { sameSite: 'strict' as const, secure, path: '/', maxAge: sessionTokenTtlSeconds * 1000 };
  res.cookie(sessionCookieName, token, { ...common, httpOnly: true });
  res.cookie(csrfCookieName, csrfTokenFor(secret, sessionId), { ...common, httpOnly: false });
}

/** Removes both cookies (sign-out). */
export function clearSessionCookies(res: Response, secure: boolean): void {
  const common = { sameSite: 'strict' as const, secure, path: '/' };
  res.clearCookie(sessionCookieName, { ...common, httpOnly: true });
  res.clearCookie(csrfCookieName, common);
}
