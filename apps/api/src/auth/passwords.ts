/**
 * Password hashing with argon2id. Parameters follow the OWASP Password Storage Cheat Sheet minimum for
 * argon2id (m = 19 MiB, t = 2, p = 1), which sits within RFC 9106 §4's guidance for memory-constrained
 * servers. The encoded hash carries its parameters, so they can be raised later without a migration.
 */
import argon2 from 'argon2';

const hashOptions = { type: argon2.argon2id, memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

/** Hashes a password for storage. */
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, hashOptions);
}

// Verified against when the account does not exist, so a wrong e-mail costs the same time as a wrong password.
let decoyHash: Promise<string> | undefined;

/** True when `password` matches `hash`; with no hash, spends the same effort and answers false. */
export async function verifyPassword(hash: string | null | undefined, password: string): Promise<boolean> {
  if (!hash) {
    decoyHash ??= argon2.hash('decoy password that matches nothing', hashOptions);
    await argon2.verify(await decoyHash, password);
    return false;
  }
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}

/** The rule new passwords must meet (NIST SP 800-63B §5.1.1.2: length over composition rules). */
export const passwordRule = { minLength: 12, maxLength: 256 } as const;
