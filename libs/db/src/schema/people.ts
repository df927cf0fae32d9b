import { sql } from 'drizzle-orm';
import { boolean, integer, pgEnum, pgTable, text, uniqueIndex } from 'drizzle-orm/pg-core';
import { createdAt, instant, updatedAt } from './timestamps';

/** The four roles; what each may do is decided by the API's permission table. */
export const userRole = pgEnum('user_role', ['admin', 'steward', 'planner', 'viewer']);

/**
 * How a person wants miss e-mails: high severity at once and the rest in the daily digest (the
 * default), every miss at once, everything in the digest, or none.
 */
export const missMailChoice = pgEnum('miss_mail_choice', ['by_severity', 'immediate', 'digest', 'none']);

/** A person who signs in. E-mail is unique regardless of letter case. */
export const users = pgTable(
  'users',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    email: text('email').notNull(),
    displayName: text('display_name').notNull(),
    role: userRole('role').notNull().default('viewer'),
    /** argon2id encoded hash (parameters inside the string); null until an invite is accepted. */
    passwordHash: text('password_hash'),
    active: boolean('active').notNull().default(true),
    missMail: missMailChoice('miss_mail').notNull().default('by_severity'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    lastSignInAt: instant('last_sign_in_at'),
  },
  (t) => [uniqueIndex('users_email_lower_key').on(sql`lower(${t.email})`)],
);
