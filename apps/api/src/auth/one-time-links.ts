/**
 * Invite and password-reset links: a random secret in the URL, its SHA-256 in the database, usable
 * once and only until it expires. Issuing a new link of the same purpose voids the older ones.
 */
import { and, eq, gt, isNull, sql } from 'drizzle-orm';
import { oneTimeTokens, type Database } from '@loadwright/db';
import { hashApiToken, newLinkSecret } from './api-token-secret';

/** How long each kind of link lives. */
export const linkLifetimes = { invite: 72 * 60, password_reset: 30 } as const satisfies Record<string, number>; // minutes

type Purpose = keyof typeof linkLifetimes;

/** Creates a link secret for a person; returns the secret to put in the URL. Call it inside the caller's transaction. */
export async function issueLink(
  tx: Pick<Database, 'update' | 'insert'>,
  userId: number,
  purpose: Purpose,
  createdById: number | null,
): Promise<string> {
  const { secret, hash } = newLinkSecret();
  await tx
    .update(oneTimeTokens)
    .set({ usedAt: new Date() })
    .where(and(eq(oneTimeTokens.userId, userId), eq(oneTimeTokens.purpose, purpose), isNull(oneTimeTokens.usedAt)));
  await tx
    .insert(oneTimeTokens)
    .values({ userId, purpose, tokenHash: hash, createdById, expiresAt: new Date(Date.now() + linkLifetimes[purpose] * 60_000) });
  return secret;
}

/** Marks a link used and returns whose it was and what for; null when unknown, used or expired. */
export async function redeemLink(db: Pick<Database, 'update'>, secret: string): Promise<{ userId: number; purpose: Purpose } | null> {
  const [row] = await db
    .update(oneTimeTokens)
    .set({ usedAt: new Date() })
    .where(and(eq(oneTimeTokens.tokenHash, hashApiToken(secret)), isNull(oneTimeTokens.usedAt), gt(oneTimeTokens.expiresAt, sql`now()`)))
    .returning({ userId: oneTimeTokens.userId, purpose: oneTimeTokens.purpose });
  return row ?? null;
}

/** True when a link of this purpose was issued to the person within the last `minutes`. */
export async function issuedRecently(db: Pick<Database, 'select'>, userId: number, purpose: Purpose, minutes: number): Promise<boolean> {
  const rows = await db
    .select({ id: oneTimeTokens.id })
    .from(oneTimeTokens)
    .where(
      and(
        eq(oneTimeTokens.userId, userId),
        eq(oneTimeTokens.purpose, purpose),
        gt(oneTimeTokens.createdAt, sql`now() - make_interval(mins => ${minutes})`),
      ),
    )
    .limit(1);
  return rows.length > 0;
}
