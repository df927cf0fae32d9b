import { sql } from 'drizzle-orm';
import { boolean, integer, pgEnum, pgTable, text, uniqueIndex } from 'drizzle-orm/pg-core';
import { createdAt, instant, updatedAt } from './timestamps';

/** The four roles; what each may do is decided by the API's permission table. */
export const userRole = pgEnum('user_role', ['admin', 'steward', 'planner', 'viewer']);

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
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    lastSignInAt: instant('last_sign_in_at'),
  },
  (t) => [uniqueIndex('users_email_lower_key').on(sql`lower(${t.email})`)],
);
