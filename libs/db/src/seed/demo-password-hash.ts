import argon2 from 'argon2';

/**
 * argon2id with the OWASP Password Storage Cheat Sheet minimum: m = 19 MiB (19,456 KiB), t = 2,
 * p = 1. RFC 9106 §4 recommends more memory where a server can spare it (its second option is
 * 64 MiB, t = 3, p = 4); the encoded hash carries its parameters, so they can be raised later and
 * the API's sign-in verifies either.
 */
const demoHashOptions = { type: argon2.argon2id, memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

/** Hashes a demo account's password for `users.password_hash` (a fresh random salt per call). */
export function hashDemoPassword(password: string): Promise<string> {
  return argon2.hash(password, demoHashOptions);
}
