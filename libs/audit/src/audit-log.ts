/** Appends to the audit log: who did what, to what, when and from where. */
import { auditLog, type Database } from '@loadwright/db';
import type { Actor } from './actor';

/** One audit entry; `detail` must never hold a password, hash or token. */
export interface AuditEntry {
  actor: Actor;
  action: string;
  targetType?: string;
  targetId?: string | number;
  detail?: Record<string, unknown>;
  ip?: string;
}

/** Writes an entry (inside the caller's transaction when given one). */
export async function recordAudit(db: Pick<Database, 'insert'>, entry: AuditEntry): Promise<void> {
  await db.insert(auditLog).values({
    actorUserId: entry.actor.kind === 'user' ? entry.actor.userId : null,
    actorTokenId: entry.actor.kind === 'token' ? entry.actor.tokenId : null,
    action: entry.action,
    targetType: entry.targetType ?? null,
    targetId: entry.targetId === undefined ? null : String(entry.targetId),
    // No actor column can name an unidentified caller, so the entry says it came from a visitor.
    detail: entry.actor.kind === 'anonymous' ? { ...entry.detail, visitor: true } : (entry.detail ?? {}),
    ip: entry.ip ?? null,
  });
}
