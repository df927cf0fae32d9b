/**
 * The import job queue ('import-upload'): its settings, its creation (by workers), and adding a job
 * on the caller's own connection, so the job and the upload's status change commit together.
 */
import { ensureQueue } from '@loadwright/db';
import PgBoss from 'pg-boss';

/** Queue of upload imports: data ImportUploadJob. */
export const importQueue = 'import-upload';

/** Data of an 'import-upload' job. */
export interface ImportUploadJob {
  uploadId: number;
}

/**
 * Retries for unexpected failures (a lost connection): two, 20 s apart and doubling. A rejected file
 * is not a failure of the job: it ends the job with the upload marked failed. A job whose worker dies
 * is handed back within about a minute by the worker heartbeat (jobs/worker-presence.ts), however long
 * the import; the hour of expiry only catches a handler that hangs in a live worker. The import is
 * idempotent and writes in one transaction, so a retry never half-writes or duplicates.
 */
export const importQueueOptions = { retryLimit: 2, retryDelay: 20, retryBackoff: true, expireInSeconds: 3600 } satisfies Omit<
  PgBoss.Queue,
  'name'
>;

/** Creates the queue, or brings its settings up to date. */
export async function createImportQueue(boss: PgBoss): Promise<void> {
  await ensureQueue(boss, importQueue, importQueueOptions);
}

/** Something that runs SQL: a pg Pool or PoolClient. */
export interface Queryable {
  query(text: string, values?: unknown[]): Promise<{ rows: unknown[] }>;
}

/** True when the queue exists (a worker has started against this database). */
export async function importQueueReady(db: Queryable): Promise<boolean> {
  const { rows } = await db.query(`select to_regclass('pgboss.queue') is not null as installed`);
  if (!(rows[0] as { installed: boolean }).installed) return false;
  return (await db.query('select 1 from pgboss.queue where name = $1', [importQueue])).rows.length > 0;
}

/** Adds an import job on `connection` (inside the caller's transaction when it is in one). */
export async function enqueueImport(connection: Queryable, uploadId: number): Promise<void> {
  const boss = new PgBoss({
    db: { executeSql: async () => ({ rows: [] }) },
    schema: 'pgboss',
    supervise: false,
    schedule: false,
    migrate: false,
  });
  const job: PgBoss.JobInsert<ImportUploadJob> = { name: importQueue, data: { uploadId }, singletonKey: `upload-${uploadId}` };
  await boss.insert([job], {
    db: { executeSql: (text: string, values: unknown[]) => connection.query(text, values) },
  });
}
