import { bigint, index, integer, jsonb, pgTable, text } from 'drizzle-orm/pg-core';
import { apiTokens } from './api-tokens';
import { users } from './people';
import { instant } from './timestamps';

/**
 * Who did what, when and from where. Append-only; the actor is a person, a token, or neither
 * (the system itself, e.g. the nightly refit).
 */
export const auditLog = pgTable(
  'audit_log',
  {
    id: bigint('id', { mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
    at: instant('at').notNull().defaultNow(),
    actorUserId: integer('actor_user_id').references(() => users.id, { onDelete: 'set null' }),
    actorTokenId: integer('actor_token_id').references(() => apiTokens.id, { onDelete: 'set null' }),
    /** Dotted verb such as `session.sign_in_failed` or `forecast.approved`. */
    action: text('action').notNull(),
    targetType: text('target_type'),
    targetId: text('target_id'),
    detail: jsonb('detail').$type<Record<string, unknown>>().notNull().default({}),
    ip: text('ip'),
  },
  (t) => [
    index('audit_log_at_idx').on(t.at.desc()),
    index('audit_log_actor_user_idx').on(t.actorUserId, t.at.desc()),
    index('audit_log_actor_token_idx').on(t.actorTokenId, t.at.desc()),
    index('audit_log_action_idx').on(t.action, t.at.desc()),
  ],
);
