/** API tokens for series tests, stored the way the token routes store them. */
import { randomUUID } from 'node:crypto';
import { apiTokens, users, type Database } from '@loadwright/db';
import { newApiTokenSecret } from '../../../apps/api/src/auth/api-token-secret';

/** Bearer secrets of one read and one read-write token. */
export interface Tokens {
  read: string;
  readWrite: string;
}

/** Creates a read and a read-write token, made by an active admin (a token acts for its creator), and returns their secrets. */
export async function createTokens(db: Database): Promise<Tokens> {
  const secrets = {} as Tokens;
  const [creator] = await db
    .insert(users)
    .values({ email: `token-maker-${randomUUID()}@test.example`, displayName: 'Token maker', role: 'admin', passwordHash: null })
    .returning({ id: users.id });
  for (const [field, scope] of [
    ['read', 'read'],
    ['readWrite', 'read-write'],
  ] as const) {
    const { token, prefix, hash } = newApiTokenSecret();
    await db.insert(apiTokens).values({ name: `series tests ${scope}`, prefix, secretHash: hash, scope, createdById: creator!.id });
    secrets[field] = token;
  }
  return secrets;
}
