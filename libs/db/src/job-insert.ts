/**
 * Adding pg-boss jobs on a Drizzle database or transaction, so a job commits or rolls back with the
 * rows that called for it. It runs pg-boss's own insert statement (produced by a client that never
 * connects) through Drizzle with bound parameters. A job for a queue not created yet is not added
 * (pg-boss 10 joins the queue table), nor is any before pg-boss has installed its schema (no worker
 * has started against this database yet): callers keep the state a sweep can recover from.
 */
import { sql, type SQL } from 'drizzle-orm';
import PgBoss from 'pg-boss';
import type { Database } from './client';

const statementMaker = new PgBoss({
  db: { executeSql: async () => ({ rows: [] }) },
  schema: 'pgboss',
  supervise: false,
  schedule: false,
  migrate: false,
});

/** A statement with $1…$n placeholders and its values as Drizzle SQL with bound parameters. */
function positional(text: string, values: unknown[]): SQL {
  const chunks: SQL[] = [];
  let last = 0;
  for (const match of text.matchAll(/\$(\d+)/g)) {
    chunks.push(sql.raw(text.slice(last, match.index)));
    chunks.push(sql`${values[Number(match[1]) - 1] ?? null}`);
    last = match.index + match[0].length;
  }
  chunks.push(sql.raw(text.slice(last)));
  return sql.join(chunks);
}

/** Adds `jobs` on `db` (inside its transaction when it is one). */
export async function insertJobs(db: Pick<Database, 'execute'>, jobs: PgBoss.JobInsert[]): Promise<void> {
  if (jobs.length === 0) return;
  const installed = await db.execute(sql`select to_regclass('pgboss.job') is not null as ok`);
  if (!(installed.rows[0] as { ok: boolean } | undefined)?.ok) return;
  await statementMaker.insert(jobs, {
    db: { executeSql: async (text: string, values: unknown[]) => ({ rows: (await db.execute(positional(text, values))).rows }) },
  });
}
