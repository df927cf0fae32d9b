/**
 * API token secrets: 32 random bytes, shown once as `lw_<prefix>_<secret>`; only the SHA-256 is stored.
 * A fast hash is enough because the secret is random and long, not a human password (common practice).
 */
import { createHash, randomBytes } from 'node:crypto';

/** A new token: the text to show once, and what to store. */
export function newApiTokenSecret(): { token: string; prefix: string; hash: string } {
  const prefix = randomBytes(4).toString('hex');
  const token = `lw_${prefix}_${randomBytes(32).toString('base64url')}`;
  return { token, prefix, hash: hashApiToken(token) };
}

/** The stored form of a presented token. */
export function hashApiToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** One-time link secrets (invite, password reset) use the same shape of random secret and hash. */
export function newLinkSecret(): { secret: string; hash: string } {
  const secret = randomBytes(32).toString('base64url');
  return { secret, hash: hashApiToken(secret) };
}
