import { sql } from 'drizzle-orm';
import { check, index, integer, pgEnum, pgTable, primaryKey, text, uuid } from 'drizzle-orm/pg-core';
import { users } from './people';
import { createdAt, instant, updatedAt } from './timestamps';

/**
 * A signed-in browser session. The signed cookie carries the id; the row lets the server end it at
 * once (sign-out, deactivation, role change) by setting revoked_at.
 */
export const sessions = pgTable(
  'sessions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: createdAt(),
    expiresAt: instant('expires_at').notNull(),
    lastSeenAt: instant('last_seen_at'),
    revokedAt: instant('revoked_at'),
    ip: text('ip'),
    userAgent: text('user_agent'),
  },
  (t) => [index('sessions_user_id_idx').on(t.userId), index('sessions_expires_at_idx').on(t.expiresAt)],
);

/** What a one-time link is for. */
export const oneTimeTokenPurpose = pgEnum('one_time_token_purpose', ['invite', 'password_reset']);

/** A single-use link (invite or password reset): only the SHA-256 of the secret is stored. */
export const oneTimeTokens = pgTable(
  'one_time_tokens',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    purpose: oneTimeTokenPurpose('purpose').notNull(),
    tokenHash: text('token_hash').notNull().unique('one_time_tokens_token_hash_key'),
    expiresAt: instant('expires_at').notNull(),
    usedAt: instant('used_at'),
    createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('one_time_tokens_user_id_idx').on(t.userId, t.purpose)],
);

/** Whether a throttle record counts failures for one account or for one client address. */
export const loginThrottleSubject = pgEnum('login_throttle_subject', ['account', 'address']);

/**
 * Failed sign-in counter per account (lower-cased e-mail) and per client address, with the
 * temporary lockout that follows too many failures inside the window.
 */
export const loginThrottles = pgTable(
  'login_throttles',
  {
    subjectKind: loginThrottleSubject('subject_kind').notNull(),
    subject: text('subject').notNull(),
    failures: integer('failures').notNull().default(0),
    windowStartedAt: instant('window_started_at').notNull().defaultNow(),
    lockedUntil: instant('locked_until'),
    updatedAt: updatedAt(),
  },
  (t) => [
    primaryKey({ name: 'login_throttles_pkey', columns: [t.subjectKind, t.subject] }),
    check('login_throttles_failures_check', sql`${t.failures} >= 0`),
  ],
);
