import { index, integer, pgEnum, pgTable, text } from 'drizzle-orm/pg-core';
import { users } from './people';
import { createdAt, instant } from './timestamps';

/** What a downstream system may do with a token. */
export const apiTokenScope = pgEnum('api_token_scope', ['read', 'read-write']);

/**
 * A bearer token for a downstream system. The secret is shown once; only its SHA-256 is kept, with
 * a short prefix so people can tell tokens apart.
 */
export const apiTokens = pgTable(
  'api_tokens',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    name: text('name').notNull(),
    secretHash: text('secret_hash').notNull().unique('api_tokens_secret_hash_key'),
    prefix: text('prefix').notNull(),
    scope: apiTokenScope('scope').notNull().default('read'),
    expiresAt: instant('expires_at'),
    lastUsedAt: instant('last_used_at'),
    revokedAt: instant('revoked_at'),
    createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('api_tokens_created_by_id_idx').on(t.createdById)],
);
