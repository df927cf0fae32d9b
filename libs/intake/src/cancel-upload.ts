/**
 * A steward cancels an import that is queued or running. The upload ends `failed` with a message
 * saying who cancelled it and that nothing was stored; a queued upload's file is deleted at once,
 * a running import notices at its next progress update (or when it would mark itself done) and
 * rolls back, deleting the file itself. An upload that finished meanwhile cannot be cancelled.
 * The cancellation and its audit entry are committed together or not at all; the file goes after.
 */
import { rm } from 'node:fs/promises';
import { and, eq, inArray } from 'drizzle-orm';
import { recordAudit, type Actor } from '@loadwright/audit';
import { uploads, type Database } from '@loadwright/db';

/** How a cancellation went: cancelled (from the status it had), or why not. */
export type CancelOutcome =
  | { cancelled: true; from: 'queued' | 'importing'; fileName: string }
  | { cancelled: false; reason: 'missing' }
  | { cancelled: false; reason: 'finished'; status: string };

/** Who cancels: the caller for the audit entry, and the name the upload's message gives them. */
export interface Canceller {
  actor: Actor;
  /** A person's or token's name, as the failed upload's message shows it. */
  by: string;
  ip?: string;
}

/** Cancels upload `id` on behalf of `canceller`, writing its audit entry in the same transaction. */
export async function cancelUpload(db: Database, id: number, { actor, by, ip }: Canceller): Promise<CancelOutcome> {
  const [row] = await db
    .select({ status: uploads.status, path: uploads.storagePath, fileName: uploads.fileName })
    .from(uploads)
    .where(eq(uploads.id, id));
  if (!row) return { cancelled: false, reason: 'missing' };
  if (row.status !== 'queued' && row.status !== 'importing') return { cancelled: false, reason: 'finished', status: row.status };
  const from = row.status;
  const cancelled = await db.transaction(async (tx) => {
    const [updated] = await tx
      .update(uploads)
      .set({
        status: 'failed',
        error: `Cancelled by ${by} while ${from === 'queued' ? 'waiting to be imported' : 'importing'}; nothing from this file was stored.`,
        progress: 0,
        storagePath: null,
        finishedAt: new Date(),
        updatedAt: new Date(),
      })
      .where(and(eq(uploads.id, id), inArray(uploads.status, ['queued', 'importing'])))
      .returning({ id: uploads.id });
    if (!updated) return false;
    await recordAudit(tx, {
      actor,
      action: 'upload.cancelled',
      targetType: 'upload',
      targetId: id,
      detail: { fileName: row.fileName, from },
      ip,
    });
    return true;
  });
  if (!cancelled) {
    const [now] = await db.select({ status: uploads.status }).from(uploads).where(eq(uploads.id, id));
    return { cancelled: false, reason: 'finished', status: now?.status ?? 'done' };
  }
  // A running import holds its file open and deletes it when it notices; a queued one's file goes now, once committed.
  if (from === 'queued' && row.path) await rm(row.path, { force: true });
  return { cancelled: true, from, fileName: row.fileName };
}
