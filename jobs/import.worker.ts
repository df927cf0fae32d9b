/**
 * The 'import-upload' handler: imports one confirmed upload per job (an import is heavy, so one at a
 * time per worker; more workers import more files side by side). A rejected file ends its job
 * normally with the upload marked failed; an unexpected error goes to pg-boss's retry, and on the
 * last attempt the upload is marked failed too, so no upload waits forever. Either change applies
 * only to an upload still queued or importing: a retry never rewrites a cancelled upload.
 */
import { and, eq, inArray } from 'drizzle-orm';
import { createDb, uploads } from '@loadwright/db';
import type PgBoss from 'pg-boss';
import { createImportQueue, importQueue, type ImportUploadJob } from '@loadwright/intake';
import { importUpload } from '@loadwright/intake';
import type { QueueContext } from './queues';

/** Creates the queue and starts its handler; its connections close when pg-boss stops. */
export async function registerImportQueue(boss: PgBoss, context: QueueContext): Promise<void> {
  const { logger, presence } = context;
  const { db, pool, close } = createDb(context.databaseUrl, { max: 3, applicationName: 'loadwright-import' });
  boss.once('stopped', () => void close());
  await createImportQueue(boss);
  await boss.work<ImportUploadJob>(
    importQueue,
    { batchSize: 1, includeMetadata: true, pollingIntervalSeconds: 0.5 },
    ([job]) => job && presence.hold([job.id], () => importOne(job)),
  );

  async function importOne(job: PgBoss.JobWithMetadata<ImportUploadJob>): Promise<void> {
    const { uploadId } = job.data;
    try {
      const outcome = await importUpload({ db, pool }, uploadId);
      if (outcome.status === 'done')
        logger.info(
          {
            uploadId,
            rows: outcome.rows,
            inserted: outcome.inserted,
            revised: outcome.revised,
            findings: outcome.findings.total,
            stageSeconds: outcome.stages,
          },
          'upload imported',
        );
      else logger.info({ uploadId, outcome }, 'upload import ended without data');
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      logger.warn({ uploadId, err: error, retryCount: job.retryCount }, 'upload import failed; the queue retries it');
      const last = job.retryCount >= job.retryLimit;
      await db
        .update(uploads)
        .set(
          last
            ? {
                status: 'failed',
                error: `The import failed on our side (${message}); nothing was stored. Upload the file again.`,
                finishedAt: new Date(),
              }
            : { status: 'queued', progress: 0 },
        )
        .where(and(eq(uploads.id, uploadId), inArray(uploads.status, ['queued', 'importing'])));
      throw error;
    }
  }
}
