/**
 * A steward cancels an import that is queued, running or awaiting a choice. The upload ends
 * `cancelled` with a message saying who cancelled it and that nothing was stored. A queued or waiting
 * upload's file is deleted at once; a running import notices at its next progress update (or when it
 * would mark itself done), rolls back and deletes the file itself, and if its worker stopped first,
 * the job's next attempt finds the upload cancelled and deletes the file then. An upload that finished
 * meanwhile cannot be cancelled. The cancellation and its audit entry are committed together or not
 * at all; the file goes after.
 */
import { rm } from 'node:fs/promises';
import { and, eq } from 'drizzle-orm';
import { recordAudit, type Actor } from '@loadwright/audit';
import { uploads, type Database } from '@loadwright/db';

/** Statuses a steward may cancel from. */
const cancellable = ['queued', 'importing', 'awaiting_choice'] as const;
type Cancellable = (typeof cancellable)[number];

/** How a cancellation went: cancelled (from the status it had), or why not. */
export type CancelOutcome =
  | { cancelled: true; from: Cancellable; fileName: string }
  | { cancelled: false; reason: 'missing' }
  | { cancelled: false; reason: 'finished'; status: string };

/** Who cancels: the caller for the audit entry, and the name the upload's message gives them. */
export interface Canceller {
  actor: Actor;
  /** A person's or token's name, as the cancelled upload's message shows it. */
  by: string;
  ip?: string;
}

/** What the upload was doing when cancelled, for the message. */
const whileDoing: Record<Cancellable, string> = {
  queued: 'waiting to be imported',
  importing: 'importing',
  awaiting_choice: 'awaiting a choice for its repeated hours',
};

/** Cancels upload `id` on behalf of `canceller`, writing its audit entry in the same transaction. */
export async function cancelUpload(db: Database, id: number, { actor, by, ip }: Canceller): Promise<CancelOutcome> {
  // The status may move on between reading and updating (queued → importing): read again and retry.
  for (;;) {
    const [row] = await db
      .select({ status: uploads.status, path: uploads.storagePath, fileName: uploads.fileName })
      .from(uploads)
      .where(eq(uploads.id, id));
    if (!row) return { cancelled: false, reason: 'missing' };
    const from = row.status;
    if (!isCancellable(from)) return { cancelled: false, reason: 'finished', status: from };
    const running = from === 'importing';
    const cancelled = await db.transaction(async (tx) => {
      const [updated] = await tx
        .update(uploads)
        .set({
          status: 'cancelled',
          error: `Cancelled by ${by} while ${whileDoing[from]}; nothing from this file was stored.`,
          progress: 0,
          repeatedHourQuestions: null,
          // A running import holds its file open and deletes it when it notices; the others' files go once committed.
          ...(running ? {} : { storagePath: null }),
          finishedAt: new Date(),
          updatedAt: new Date(),
        })
        .where(and(eq(uploads.id, id), eq(uploads.status, from)))
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
    if (!cancelled) continue;
    if (!running && row.path) await rm(row.path, { force: true });
    return { cancelled: true, from, fileName: row.fileName };
  }
}

function isCancellable(status: string): status is Cancellable {
  return (cancellable as readonly string[]).includes(status);
}
