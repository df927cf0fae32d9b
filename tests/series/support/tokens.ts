/** API tokens for series tests, stored the way the token routes store them. */
import { apiTokens, type Database } from '@loadwright/db';
import { newApiTokenSecret } from '../../../apps/api/src/auth/api-token-secret';

/** Bearer secrets of one read and one read-write token. */
export interface Tokens {
  read: string;
  readWrite: string;
}

/** Creates a read and a read-write token and returns their secrets. */
export async function createTokens(db: Database): Promise<Tokens> {
  const secrets = {} as Tokens;
  for (const [field, scope] of [
    ['read', 'read'],
    ['readWrite', 'read-write'],
  ] as const) {
    const { token, prefix, hash } = newApiTokenSecret();
    await db.insert(apiTokens).values({ name: `series tests ${scope}`, prefix, secretHash: hash, scope });
    secrets[field] = token;
  }
  return secrets;
}
