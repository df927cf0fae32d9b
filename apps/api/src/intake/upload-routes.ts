/**
 * The routes under /api/uploads (stewards and admins, permission data.upload): receive a CSV file
 * (streamed to disk with its SHA-256), confirm its mapping (which queues the import job) or discard
 * it, follow an upload's progress and report, and download its findings as CSV.
 */
import { rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/node-postgres';
import multer from 'multer';
import {
  confirmUploadRequestSchema,
  uploadDetailSchema,
  uploadListQuerySchema,
  uploadPageSchema,
  uploadReceiptSchema,
  uploadSchema,
  type RepeatedHourQuestion,
  type UploadDetail,
  type UploadMapping,
  type UploadSettings,
  idParamsSchema,
  unstorableTextReason,
} from '@loadwright/contracts';
import { uploads } from '@loadwright/db';
import type { Request, Response } from 'express';
import type { AppContext } from '../app-context';
import type { Actor } from '@loadwright/audit';
import { clientAddress } from '../auth/client-address';
import { recordAudit } from '@loadwright/audit';
import { HttpProblem } from '@loadwright/problems';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { csvLine, numberCell, textCell } from '../http/csv-cells';
import { sniffFile } from '@loadwright/intake';
import { hashingDiskStorage, type StoredFile } from './hashing-disk-storage';
import { planImport } from '@loadwright/intake';
import { enqueueImport, importQueueReady } from '@loadwright/intake';
import { loadCatalogue } from '@loadwright/intake';
import { proposeMapping } from '@loadwright/intake';
import { allFindings, cancelUpload, findUpload, listUploads, uploadReport, uploadWithContent } from '@loadwright/intake';

const tag = 'Uploads';
const idParams = idParamsSchema;

/** Messages of the multipart reader (busboy) when the body itself is broken, not the server. */
const malformedMultipart =
  /^(Unexpected end of (form|multipart data)|Malformed part header|Multipart: Boundary not found|Malformed urlencoded form)/i;

/** Default folder for files awaiting import (API and worker share the machine's temp folder). */
export const defaultUploadFolder = join(tmpdir(), 'loadwright-uploads');

/** Default upload size limit when the context sets none: 512 MiB (UPLOAD_MAX_MB). */
const defaultMaxBytes = 512 * 1024 * 1024;

/** The routes under /api/uploads. */
export function uploadRoutes(context: AppContext): RouteDefinition[] {
  const { db, pool } = context;
  const folder = context.uploadFolder ?? defaultUploadFolder;
  const maxBytes = context.uploadMaxBytes ?? defaultMaxBytes;
  // Browsers send file names as UTF-8 bytes (Zähler-Süd.csv); busboy would read them as Latin-1 by default.
  const receiver = multer({
    storage: hashingDiskStorage(folder),
    limits: { fileSize: maxBytes, files: 1, fields: 5 },
    defParamCharset: 'utf8',
  }).single('file');

  /** Runs multer; resolves with the stored file, or throws a problem the steward can act on. */
  const receive = (req: Request, res: Response) =>
    new Promise<StoredFile>((resolve, reject) => {
      receiver(req, res, (error: unknown) => {
        if (error instanceof multer.MulterError && error.code === 'LIMIT_FILE_SIZE') {
          reject(
            new HttpProblem(
              'payloadTooLarge',
              `The file is larger than the upload limit of ${Math.round(maxBytes / 1048576)} MB; split it into smaller files.`,
            ),
          );
        } else if (error instanceof multer.MulterError) {
          reject(
            new HttpProblem('invalidInput', `Send one file in the form field "file" (${error.message}).`, [
              { pointer: '/file', detail: error.message },
            ]),
          );
        } else if (error instanceof Error && malformedMultipart.test(error.message)) {
          reject(
            new HttpProblem('invalidInput', `The multipart/form-data body is malformed (${error.message}); send the file again.`, [
              { pointer: '/file', detail: error.message },
            ]),
          );
        } else if (error) {
          reject(error);
        } else if (!req.file) {
          reject(
            new HttpProblem('invalidInput', 'Send the file as multipart/form-data in the form field "file".', [
              { pointer: '/file', detail: 'Choose a CSV file' },
            ]),
          );
        } else {
          resolve(req.file as StoredFile);
        }
      });
    });

  /** The detail of an upload: its report, and while awaiting its mapping, the first look at its file. */
  const detail = async (id: number): Promise<UploadDetail> => {
    const upload = await findUpload(db, id);
    if (!upload) throw new HttpProblem('notFound', `No upload with id ${id}.`);
    const report = await uploadReport(db, id);
    const [row] = await db
      .select({ path: uploads.storagePath, questions: uploads.repeatedHourQuestions })
      .from(uploads)
      .where(eq(uploads.id, id));
    const repeatedHours = upload.status === 'awaiting_choice' ? ((row?.questions ?? []) as unknown as RepeatedHourQuestion[]) : [];
    const empty = { layout: null, preview: null, proposal: null, repeatedHours };
    if (upload.status !== 'received') return { upload, report, ...empty };
    const sniffed = row?.path ? await sniffFile(row.path).catch(() => null) : null;
    if (!sniffed?.ok) return { upload, report, ...empty };
    const catalogue = await loadCatalogue(db);
    return {
      upload,
      report,
      repeatedHours,
      layout: sniffed.layout,
      preview: sniffed.preview,
      proposal: proposeMapping(sniffed.layout, sniffed.preview, catalogue),
    };
  };

  const who = (actor: Actor) => ({
    uploadedById: actor.kind === 'user' ? actor.userId : null,
    uploadedByTokenId: actor.kind === 'token' ? actor.tokenId : null,
  });

  return [
    defineRoute({
      method: 'post',
      path: '/uploads',
      access: 'data.upload',
      tag,
      summary:
        'Upload a CSV file (multipart field "file"): stored, hashed and previewed with a proposed mapping; the same bytes again answer with the earlier upload',
      response: uploadReceiptSchema,
      handler: async ({ req, res, actor }) => {
        const file = await receive(req, res);
        const nameProblem = unstorableTextReason(file.originalname);
        if (nameProblem) {
          await rm(file.path, { force: true });
          throw new HttpProblem('invalidInput', `The file name cannot be stored: ${nameProblem}. Rename the file and upload it again.`, [
            { pointer: '/file', detail: `File name: ${nameProblem}` },
          ]);
        }
        const earlier = await uploadWithContent(db, file.sha256);
        if (earlier !== null) {
          await rm(file.path, { force: true });
          const found = await detail(earlier);
          const done = found.upload.status === 'done';
          return {
            ...found,
            duplicateOf: earlier,
            message: `${done ? 'Already imported' : 'Already uploaded'} as upload ${earlier}; nothing was added.`,
          };
        }
        const sniffed = await sniffFile(file.path);
        const fileName = file.originalname.slice(0, 255) || 'upload.csv';
        const values = sniffed.ok
          ? { status: 'received' as const, storagePath: file.path }
          : { status: 'failed' as const, error: sniffed.message, storagePath: null, finishedAt: new Date() };
        if (!sniffed.ok) await rm(file.path, { force: true });
        const id = await db
          .transaction(async (tx) => {
            const inserted = await tx
              .insert(uploads)
              .values({ source: 'csv', fileName, contentSha256: file.sha256, byteSize: file.size, ...who(actor), ...values })
              .onConflictDoNothing()
              .returning({ id: uploads.id });
            if (inserted.length === 0) return null;
            await recordAudit(tx, {
              actor,
              action: 'upload.received',
              targetType: 'upload',
              targetId: inserted[0]!.id,
              detail: { fileName, byteSize: file.size, accepted: sniffed.ok },
              ip: clientAddress(req),
            });
            return inserted[0]!.id;
          })
          .catch(async (error: unknown) => {
            // Nothing was recorded, so the stored file would be orphaned.
            if (sniffed.ok) await rm(file.path, { force: true });
            throw error;
          });
        if (id === null) {
          // The same bytes arrived at the same moment from elsewhere: answer as a repeat.
          await rm(file.path, { force: true });
          const earlierId = (await uploadWithContent(db, file.sha256))!;
          return {
            ...(await detail(earlierId)),
            duplicateOf: earlierId,
            message: `Already uploaded as upload ${earlierId}; nothing was added.`,
          };
        }
        res.status(201);
        return { ...(await detail(id)), duplicateOf: null, message: sniffed.ok ? null : sniffed.message };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/uploads/:id/mapping',
      access: 'data.upload',
      tag,
      summary:
        'Confirm the column mapping, unit, time zone, interval convention and repeated-hour policy; checks them against the file and queues the import',
      params: idParams,
      body: confirmUploadRequestSchema,
      response: uploadSchema,
      handler: async ({ params, body, actor, req }) => {
        const [row] = await db.select().from(uploads).where(eq(uploads.id, params.id));
        if (!row) throw new HttpProblem('notFound', `No upload with id ${params.id}.`);
        if (row.status !== 'received')
          throw new HttpProblem('conflict', `Upload ${row.id} is ${row.status}; only a received upload takes a mapping.`);
        const sniffed = row.storagePath ? await sniffFile(row.storagePath).catch(() => null) : null;
        if (!sniffed?.ok) throw new HttpProblem('conflict', `The stored file of upload ${row.id} is gone; upload it again.`);
        const planned = planImport(body.mapping, body.settings, sniffed.layout, sniffed.preview, await loadCatalogue(db));
        if (!planned.ok) throw new HttpProblem('invalidInput', planned.message, [{ pointer: '/mapping', detail: planned.message }]);
        if (!(await importQueueReady(pool)))
          throw new HttpProblem('unavailable', 'The import queue is not running: start a worker (npm start runs one) and confirm again.');
        const client = await pool.connect();
        try {
          await client.query('begin');
          const updated = await client.query(
            `update uploads set status = 'queued', mapping = $2, settings = $3, updated_at = now() where id = $1 and status = 'received'`,
            [row.id, JSON.stringify(body.mapping satisfies UploadMapping), JSON.stringify(body.settings satisfies UploadSettings)],
          );
          if (updated.rowCount !== 1) throw new HttpProblem('conflict', `Upload ${row.id} was confirmed meanwhile.`);
          await enqueueImport(client, row.id);
          await recordAudit(drizzle(client), {
            actor,
            action: 'upload.mapped',
            targetType: 'upload',
            targetId: row.id,
            detail: { layout: body.mapping.layout, unit: body.settings.unit, timeZone: body.settings.timeZone },
            ip: clientAddress(req),
          });
          await client.query('commit');
        } catch (error) {
          await client.query('rollback');
          throw error;
        } finally {
          client.release();
        }
        return (await findUpload(db, row.id))!;
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/uploads/:id',
      access: 'data.upload',
      tag,
      summary: 'Discard an upload that is still awaiting its mapping (its stored file is deleted; nothing was imported)',
      params: idParams,
      handler: async ({ params, actor, req }) => {
        const [row] = await db
          .select({ id: uploads.id, status: uploads.status, path: uploads.storagePath, fileName: uploads.fileName })
          .from(uploads)
          .where(eq(uploads.id, params.id));
        if (!row) throw new HttpProblem('notFound', `No upload with id ${params.id}.`);
        if (row.status !== 'received')
          throw new HttpProblem('conflict', `Upload ${row.id} is ${row.status}; only an upload awaiting its mapping can be discarded.`);
        await db.transaction(async (tx) => {
          const deleted = await tx
            .delete(uploads)
            .where(and(eq(uploads.id, row.id), eq(uploads.status, 'received')))
            .returning({ id: uploads.id });
          if (deleted.length === 0) throw new HttpProblem('conflict', `Upload ${row.id} was confirmed meanwhile.`);
          await recordAudit(tx, {
            actor,
            action: 'upload.discarded',
            targetType: 'upload',
            targetId: row.id,
            detail: { fileName: row.fileName },
            ip: clientAddress(req),
          });
        });
        // The file goes only once the row and its audit entry are committed.
        if (row.path) await rm(row.path, { force: true });
      },
    }),
    defineRoute({
      method: 'post',
      path: '/uploads/:id/cancel',
      access: 'data.upload',
      tag,
      summary:
        'Cancel an import that is queued, running or awaiting a choice: it ends cancelled, saying who cancelled it, and stores nothing',
      params: idParams,
      response: uploadSchema,
      handler: async ({ params, actor, req }) => {
        const by = actor.kind === 'user' ? actor.displayName : actor.kind === 'token' ? `token "${actor.name}"` : 'someone';
        const outcome = await cancelUpload(db, params.id, { actor, by, ip: clientAddress(req) });
        if (!outcome.cancelled && outcome.reason === 'missing') throw new HttpProblem('notFound', `No upload with id ${params.id}.`);
        if (!outcome.cancelled)
          throw new HttpProblem(
            'conflict',
            outcome.status === 'received'
              ? `Upload ${params.id} awaits its mapping; discard it instead.`
              : `Upload ${params.id} is ${outcome.status}; only an import that is queued, running or awaiting a choice can be cancelled.`,
          );
        return (await findUpload(db, params.id))!;
      },
    }),
    defineRoute({
      method: 'get',
      path: '/uploads',
      access: 'data.upload',
      tag,
      summary: 'Uploads, newest first, with status and progress',
      query: uploadListQuerySchema,
      response: uploadPageSchema,
      handler: ({ query }) => listUploads(db, query),
    }),
    defineRoute({
      method: 'get',
      path: '/uploads/:id',
      access: 'data.upload',
      tag,
      summary:
        'One upload: status, progress 0–100, counts, the validation report (counts and up to 10 examples per rule); while awaiting its mapping also the preview and proposal',
      params: idParams,
      response: uploadDetailSchema,
      handler: ({ params }) => detail(params.id),
    }),
    defineRoute({
      method: 'get',
      path: '/uploads/:id/report.csv',
      access: 'data.upload',
      tag,
      summary: 'Every finding of an upload as CSV (spreadsheet formulas in text neutralised)',
      params: idParams,
      produces: 'text/csv',
      status: 200,
      handler: async ({ params, res }) => {
        const upload = await findUpload(db, params.id);
        if (!upload) throw new HttpProblem('notFound', `No upload with id ${params.id}.`);
        res.status(200);
        res.setHeader('Content-Type', 'text/csv; charset=utf-8');
        res.setHeader('Content-Disposition', `attachment; filename="upload-${upload.id}-findings.csv"`);
        res.write(csvLine(['rule', 'series', 'ts', 'value', 'source_row', 'detail'].map(textCell)));
        for await (const page of allFindings(db, upload.id)) {
          const text = page
            .map((f) =>
              csvLine([
                textCell(f.rule),
                textCell(f.seriesKey),
                textCell(f.ts),
                numberCell(f.value, null),
                numberCell(f.sourceRow, null),
                textCell(JSON.stringify(f.detail)),
              ]),
            )
            .join('');
          if (!res.write(text)) await new Promise((resolve) => res.once('drain', resolve));
        }
        res.end();
      },
    }),
  ];
}
