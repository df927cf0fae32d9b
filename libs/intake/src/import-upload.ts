/**
 * Imports one confirmed upload, as the import job runs it: read the stored file again (streamed),
 * validate, and write every reading and finding in ONE transaction, so the upload lands whole or
 * not at all. Progress goes to the upload row over a separate connection while the transaction
 * runs, so the web app can show it. A rejection marks the upload failed with its one message and
 * stores nothing. Safe to run twice: a finished, failed or cancelled upload is left alone. A steward
 * may cancel a queued or running import (cancelUpload): the running one notices at its next progress
 * update, or at the latest when it would mark itself done, and rolls back. When the file's order
 * cannot place a repeated daylight-saving hour and the steward has not chosen how to read it, the
 * import stores nothing and waits (`awaiting_choice`) with the hours to ask about; the file stays.
 */
import { rm } from 'node:fs/promises';
import { and, eq, inArray, sql } from 'drizzle-orm';
import { maxRepeatedHourQuestions, type RepeatedHourQuestion, type UploadMapping, type UploadSettings } from '@loadwright/contracts';
import { auditLog, uploads, type Database } from '@loadwright/db';
import type { Pool } from 'pg';
import { sniffFile } from './csv/sniff';
import { FindingTally } from './findings';
import { StageClock, type ImportStages } from './import-stages';
import { planImport } from './import-plan';
import { screenSeries, storeSeries, validateScreened, type ScreenedSeries } from './import-series';
import { loadCatalogue } from './load-catalogue';
import { readUploadFile } from './read-upload-file';
import { UploadRejection } from './upload-rejection';
import { writeFindings } from './write-findings';

/** Share of the progress bar given to reading the file; the rest is writing. */
const readShare = 0.5;

/** What the import needs. */
export interface ImportUploadDeps {
  db: Database;
  /** Pool for progress updates outside the import transaction. */
  pool: Pool;
  /** Readings after this instant are findings (default: the clock). */
  now?: Date;
}

/** How an import ended. */
export type ImportUploadOutcome =
  | {
      status: 'done';
      rows: number;
      inserted: number;
      unchanged: number;
      revised: number;
      rejected: number;
      findings: FindingTally;
      stages: ImportStages;
    }
  | { status: 'failed'; message: string }
  | { status: 'cancelled' }
  | { status: 'awaiting_choice'; questions: number }
  | { status: 'skipped'; reason: string };

/** Statuses an import job leaves alone: nothing left to import, or a steward must act first. */
const settledStatuses = new Set(['done', 'failed', 'cancelled', 'received', 'awaiting_choice']);

/** Thrown inside the import when a steward cancelled it meanwhile: the transaction rolls back. */
class ImportCancelled extends Error {}

/** Runs the import of upload `uploadId`. Throws only on unexpected errors (the job retries those). */
export async function importUpload(deps: ImportUploadDeps, uploadId: number): Promise<ImportUploadOutcome> {
  const { db, pool } = deps;
  const [upload] = await db.select().from(uploads).where(eq(uploads.id, uploadId));
  if (!upload) return { status: 'skipped', reason: `upload ${uploadId} does not exist` };
  if (settledStatuses.has(upload.status)) {
    // A cancelled import whose worker stopped before noticing left its file for the next attempt to delete.
    if (upload.status === 'cancelled' && upload.storagePath) await forgetFile(db, uploadId, upload.storagePath);
    return { status: 'skipped', reason: `upload ${uploadId} is ${upload.status}` };
  }
  // Each progress update also learns whether the steward cancelled the import (the row is then no longer importing).
  const progress = (fraction: number, rows: number) =>
    pool
      .query(`update uploads set progress = $2, rows_processed = $3, updated_at = now() where id = $1 and status = 'importing'`, [
        uploadId,
        Math.min(1, Math.max(0, fraction)),
        rows,
      ])
      .then((result) => {
        if (result.rowCount === 0) throw new ImportCancelled();
      });
  const started = await db
    .update(uploads)
    .set({ status: 'importing', startedAt: new Date(), progress: 0, rowsProcessed: 0, error: null })
    .where(and(eq(uploads.id, uploadId), inArray(uploads.status, ['queued', 'importing'])))
    .returning({ id: uploads.id });
  if (started.length === 0) return { status: 'skipped', reason: `upload ${uploadId} was cancelled` };

  const clock = new StageClock();
  try {
    if (!upload.storagePath || !upload.mapping || !upload.settings)
      throw new UploadRejection('The upload has no stored file or no confirmed mapping; upload the file again.');
    const sniffed = await sniffFile(upload.storagePath).catch(() => ({
      ok: false as const,
      message: 'The stored file is gone; upload the file again.',
    }));
    if (!sniffed.ok) throw new UploadRejection(sniffed.message);
    const catalogue = await loadCatalogue(db);
    const planned = planImport(
      upload.mapping as UploadMapping,
      upload.settings as UploadSettings,
      sniffed.layout,
      sniffed.preview,
      catalogue,
    );
    if (!planned.ok) throw new UploadRejection(planned.message);
    const settings = planned.plan.settings;

    const path = upload.storagePath;
    const file = await clock.time('read', () =>
      readUploadFile(path, sniffed.layout, planned.plan, (fraction, rows) => progress(fraction * readShare, rows)),
    );
    let readings = 0;
    for (const intake of file.bySeries.values()) readings += intake.readings.length;
    if (file.questions.length > 0) return await askAboutRepeatedHours(db, uploadId, upload.storagePath, file);
    if (readings === 0) throw new UploadRejection(noUsableRowsMessage(file.rows, file.findings[0]));

    const tally = new FindingTally();
    for (const finding of file.findings) tally.add(finding);
    const totals = { inserted: 0, unchanged: 0, revised: 0, rejected: file.rejected };
    let written = 0;
    const doneMeanwhile = await clock.time('transaction', () =>
      db.transaction(async (tx) => {
        // A copy of this job handed back while the first still runs (a worker cut off from the database
        // but not dead) waits here, then finds the upload done and writes nothing.
        await tx.execute(sql`select pg_advisory_xact_lock(hashtext('loadwright.import-upload'), ${uploadId})`);
        const [current] = await tx.select({ status: uploads.status }).from(uploads).where(eq(uploads.id, uploadId));
        if (current?.status === 'done') return true;
        // Screen every series first (quick queries), then validate each series in JavaScript while
        // the previous one is being written, so the CPU work overlaps the database's.
        const screened: ScreenedSeries[] = [];
        for (const [id, { series, readings: columns }] of file.bySeries) {
          screened.push(await clock.time('screen', () => screenSeries(tx, { ...series, seriesId: series.id }, columns, deps.now)));
          file.bySeries.delete(id); // the screened copy replaces the raw columns
        }
        let writing: Promise<void> = Promise.resolve();
        for (const one of screened) {
          const validated = clock.timeSync('validate', () => validateScreened(one, settings.estimateShortGaps === false ? 0 : 3));
          await writing;
          const before = written;
          writing = clock
            .time('write', () =>
              storeSeries(tx, one.target.seriesId, validated, {
                uploadId,
                onRows: (rows) => progress(readShare + ((1 - readShare) * Math.min(readings, before + rows)) / readings, file.rows),
              }),
            )
            .then((result) => {
              totals.inserted += result.inserted;
              totals.unchanged += result.unchanged;
              totals.revised += result.revised;
              totals.rejected += result.rejected;
              tally.merge(result.findings);
            });
          written += validated.rows.length;
        }
        await writing;
        const finished = await clock.time('findings', async () => {
          await writeFindings(tx, uploadId, file.findings);
          return tx
            .update(uploads)
            .set({
              status: 'done',
              progress: 1,
              rowsTotal: file.rows,
              rowsProcessed: file.rows,
              rowsImported: totals.inserted,
              rowsUnchanged: totals.unchanged,
              rowsRevised: totals.revised,
              rowsRejected: totals.rejected,
              finishedAt: new Date(),
              storagePath: null,
              updatedAt: new Date(),
            })
            .where(and(eq(uploads.id, uploadId), eq(uploads.status, 'importing')))
            .returning({ id: uploads.id });
        });
        // Cancelled while the last rows were written: nothing of the file stays.
        if (finished.length === 0) throw new ImportCancelled();
        await tx.insert(auditLog).values({
          actorUserId: upload.uploadedById,
          actorTokenId: upload.uploadedByTokenId,
          action: 'upload.imported',
          targetType: 'upload',
          targetId: String(uploadId),
          // Where the time went, for explaining a slow import (the transaction's own total is not known yet).
          detail: { fileName: upload.fileName, rows: file.rows, ...totals, stageSeconds: clock.work() },
        });
        return false;
      }),
    );
    if (doneMeanwhile) return { status: 'skipped', reason: `upload ${uploadId} was imported by another attempt` };
    await rm(upload.storagePath, { force: true });
    return { status: 'done', rows: file.rows, ...totals, findings: tally, stages: clock.read() };
  } catch (error) {
    if (error instanceof ImportCancelled) {
      if (upload.storagePath) await forgetFile(db, uploadId, upload.storagePath);
      return { status: 'cancelled' };
    }
    if (!(error instanceof UploadRejection)) throw error;
    await db
      .update(uploads)
      .set({ status: 'failed', error: error.message, progress: 0, finishedAt: new Date(), storagePath: null, updatedAt: new Date() })
      .where(and(eq(uploads.id, uploadId), eq(uploads.status, 'importing')));
    if (upload.storagePath) await rm(upload.storagePath, { force: true });
    return { status: 'failed', message: error.message };
  }
}

/**
 * Stops the import before anything is written, keeping the file, with the repeated hours the steward
 * must choose for. A cancellation that came meanwhile wins: the file then goes.
 */
async function askAboutRepeatedHours(
  db: Database,
  uploadId: number,
  path: string,
  file: { rows: number; questions: RepeatedHourQuestion[] },
): Promise<ImportUploadOutcome> {
  if (file.questions.length > maxRepeatedHourQuestions)
    throw new UploadRejection(
      `The file holds ${file.questions.length} repeated daylight-saving hours whose readings its order cannot place, more than the ${maxRepeatedHourQuestions} one upload can ask about; sort the rows by time or give times with a UTC offset, and upload it again.`,
    );
  const asked = await db
    .update(uploads)
    .set({ status: 'awaiting_choice', repeatedHourQuestions: file.questions, progress: 0, rowsTotal: file.rows, updatedAt: new Date() })
    .where(and(eq(uploads.id, uploadId), eq(uploads.status, 'importing')))
    .returning({ id: uploads.id });
  if (asked.length === 0) {
    await forgetFile(db, uploadId, path);
    return { status: 'cancelled' };
  }
  return { status: 'awaiting_choice', questions: file.questions.length };
}

/** Deletes a cancelled upload's file and forgets its path. */
async function forgetFile(db: Database, uploadId: number, path: string): Promise<void> {
  await rm(path, { force: true });
  await db
    .update(uploads)
    .set({ storagePath: null })
    .where(and(eq(uploads.id, uploadId), eq(uploads.status, 'cancelled')));
}

/** The message for a file none of whose rows could be stored. */
function noUsableRowsMessage(
  rows: number,
  first: { sourceRow: number | null; rule: string; detail: Record<string, unknown> } | undefined,
): string {
  if (rows === 0) return 'The file has a header row but no data rows.';
  if (!first) return `None of the ${rows} data rows holds a reading: every mapped value cell is empty.`;
  const d = first.detail;
  const why =
    first.rule === 'unknown_series'
      ? `column "${String(d['column'])}": "${String(d['key'])}" is not a series in the catalogue`
      : first.rule === 'dst_missing_hour'
        ? `${String(d['local'])} does not exist in ${String(d['timeZone'])} (clocks skip that hour)`
        : first.rule === 'dst_repeated_hour'
          ? `${String(d['local'])} occurs twice in ${String(d['timeZone'])}${d['resolution'] === 'rejected' ? ' and the upload rejects repeated hours' : `; ${String(d['resolution'])}`}`
          : first.rule === 'unparseable'
            ? `column "${String(d['column'])}" reads "${String(d['cell'])}", which is no reading`
            : first.rule === 'impossible'
              ? `column "${String(d['column'])}": ${String(d['cell'])} ${String(d['unit'])} lies beyond anything the series can read`
              : first.rule === 'partial_interval'
                ? `its ${String(d['fileIntervalMinutes'])}-minute readings fill ${String(d['readings'])} of the ${String(d['needed'])} a ${String(d['intervalMinutes'])}-minute interval needs`
                : `${first.rule.replaceAll('_', ' ')}`;
  return `None of the ${rows} data rows can be stored; the first problem is row ${first.sourceRow}, ${why}.`;
}
