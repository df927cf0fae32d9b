/**
 * Closes uploads that nobody will finish: an upload still queued or importing whose import job is gone
 * from the queue (its last attempt was handed back after its worker stopped, or the job was deleted)
 * is marked failed with a message the steward can act on. Its import ran in one transaction, so nothing
 * of it was stored. The update is guarded by status, so two workers sweeping at once change it once.
 * A cancelled upload whose running import never noticed (its worker stopped, no attempt left) still
 * has its file: the sweep deletes it.
 */
import { rm } from 'node:fs/promises';
import type pg from 'pg';
import { importQueue } from '@loadwright/intake';

/** The message an interrupted upload ends with. */
export const interruptedImportMessage =
  'The import was interrupted on every attempt (the worker running it stopped); nothing was stored. Upload the file again.';

/** No live job of the upload's import (the SQL condition, `u` being the upload). */
const noLiveJob = `not exists (select 1 from pgboss.job j where j.name = $1 and j.state < 'completed' and j.data->>'uploadId' = u.id::text)`;

/** Marks orphaned uploads failed and deletes files of cancelled uploads left behind; returns the failed ids. */
export async function sweepOrphanedImports(pool: pg.Pool): Promise<number[]> {
  const { rows } = await pool.query<{ id: number }>(
    `update uploads u set status = 'failed', error = $2, progress = 0, finished_at = now(), updated_at = now()
      where u.status in ('queued', 'importing') and u.updated_at < now() - interval '1 minute' and ${noLiveJob}
      returning u.id`,
    [importQueue, interruptedImportMessage],
  );
  const left = await pool.query<{ path: string }>(
    `update uploads u set storage_path = null from uploads before
      where before.id = u.id and u.status = 'cancelled' and u.storage_path is not null
        and u.updated_at < now() - interval '1 minute' and ${noLiveJob}
      returning before.storage_path as path`,
    [importQueue],
  );
  for (const { path } of left.rows) if (path) await rm(path, { force: true });
  return rows.map((row) => row.id);
}
