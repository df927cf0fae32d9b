/**
 * CSRF defence for cookie-authenticated writes: the token is an HMAC of the session id, handed to the
 * page in a readable cookie and echoed back in a header. A cross-site form can neither read the cookie
 * nor set the header. (Double-submit cookie, signed variant: OWASP CSRF Prevention Cheat Sheet.)
 */
import { createHmac, timingSafeEqual } from 'node:crypto';

/** Cookie the web app reads, and header it sends back (Angular's HttpClient XSRF support uses both). */
export const csrfCookieName = 'lw_csrf';
export const csrfHeaderName = 'x-csrf-token';

/** The CSRF token bound to one session. */
export function csrfTokenFor(secret: Uint8Array, sessionId: string): string {
  return createHmac('sha256', secret).update(`csrf:${sessionId}`).digest('base64url');
}

/** True when `presented` is the session's CSRF token. */
export function isValidCsrfToken(secret: Uint8Array, sessionId: string, presented: string | undefined): boolean {
  if (!presented) return false;
  const expected = Buffer.from(csrfTokenFor(secret, sessionId));
  const given = Buffer.from(presented);
  return given.length === expected.length && timingSafeEqual(given, expected);
}
