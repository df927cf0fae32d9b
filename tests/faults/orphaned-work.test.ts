/**
 * What the worker's reaper and sweeper decide, on a real database and pg-boss queue: an active job
 * that no live worker holds goes back to the queue, a held one stays; an upload whose import job is gone
 * (its last attempt ended with its worker) is marked failed with a message, one with a live job stays.
 */
import { existsSync } from 'node:fs';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { uploads } from '@loadwright/db';
import { importQueue } from '@loadwright/intake';
import type PgBoss from 'pg-boss';
import { pino } from 'pino';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBoss } from '../../jobs/boss';
import { interruptedImportMessage, sweepOrphanedImports } from '../../jobs/import-sweeper';
import { reapOrphanedJobs, startWorkerPresence, type WorkerPresence } from '../../jobs/worker-presence';
import { createImportQueue } from '@loadwright/intake';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;
let boss: PgBoss;
let presence: WorkerPresence;

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  boss = createBoss(server.databaseUrl, { supervise: false });
  boss.on('error', () => {});
  await boss.start();
  await createImportQueue(boss);
  presence = await startWorkerPresence(boss, { databaseUrl: server.databaseUrl, name: 'worker-t', logger: pino({ level: 'silent' }) });
}, 60_000);

afterAll(async () => {
  await presence?.stop();
  await boss?.stop({ wait: true, timeout: 5_000 });
  await server?.close();
});

/** Sends an import job and makes it active as a worker's fetch would, started `secondsAgo` ago. */
async function activeJob(uploadId: number, secondsAgo: number): Promise<string> {
  const id = await boss.send(importQueue, { uploadId });
  await server.pool.query(`update pgboss.job set state = 'active', started_on = now() - make_interval(secs => $2) where id = $1`, [
    id,
    secondsAgo,
  ]);
  return id!;
}

/** State and retry count of a job. */
async function jobState(id: string): Promise<{ state: string; retry_count: number }> {
  const { rows } = await server.pool.query('select state, retry_count from pgboss.job where id = $1', [id]);
  return rows[0];
}

describe('reapOrphanedJobs', () => {
  it('hands back a job no live worker holds, and leaves a held one and a just-started one alone', async () => {
    const orphan = await activeJob(1001, 120);
    const fresh = await activeJob(1002, 1);
    const held = await activeJob(1003, 120);
    let release!: () => void;
    const running = presence.hold([held], () => new Promise<void>((done) => (release = done)));
    // The presence lists held jobs at its next beat; write one now as the 10 s timer would.
    await server.pool.query(`update worker_heartbeats set jobs = $1::uuid[], beat_at = now() where name = 'worker-t'`, [[held]]);

    const reaped = await reapOrphanedJobs(server.pool, boss);

    expect(reaped).toEqual([{ queue: importQueue, ids: [orphan] }]);
    // Back in 'retry' (the import queue allows two); pg-boss 10 counts the retry when a worker fetches it again.
    expect(await jobState(orphan)).toEqual({ state: 'retry', retry_count: 0 });
    expect((await jobState(fresh)).state).toBe('active');
    expect((await jobState(held)).state).toBe('active');
    release();
    await running;
  });

  it('hands back the jobs of a worker whose heartbeat is three beats old', async () => {
    const job = await activeJob(1004, 120);
    await server.pool.query(
      `insert into worker_heartbeats (id, name, host, pid, beat_seconds, jobs, beat_at)
       values (gen_random_uuid(), 'worker-dead', 'elsewhere', 1, 10, $1::uuid[], now() - interval '31 seconds')`,
      [[job]],
    );
    const reaped = await reapOrphanedJobs(server.pool, boss);
    expect(reaped.flatMap((r) => r.ids)).toContain(job);
  });
});

describe('sweepOrphanedImports', () => {
  it('fails an importing upload whose job is gone, keeps one whose job waits, and stores no reading', async () => {
    const row = (name: string) => ({
      fileName: name,
      contentSha256: `sha-${name}`,
      byteSize: 10,
      status: 'importing' as const,
      updatedAt: new Date(Date.now() - 5 * 60_000),
    });
    const [gone, waiting] = await server.db
      .insert(uploads)
      .values([row('gone.csv'), row('waiting.csv')])
      .returning({ id: uploads.id });
    // updated_at is set on update by the schema; put it back five minutes, as an upload idle that long.
    await server.pool.query(`update uploads set updated_at = now() - interval '5 minutes' where id = any($1)`, [[gone!.id, waiting!.id]]);
    await boss.send(importQueue, { uploadId: waiting!.id });

    expect(await sweepOrphanedImports(server.pool)).toEqual([gone!.id]);

    const { rows } = await server.pool.query('select id, status, error from uploads where id = any($1) order by id', [
      [gone!.id, waiting!.id],
    ]);
    expect(rows).toEqual([
      { id: gone!.id, status: 'failed', error: interruptedImportMessage },
      { id: waiting!.id, status: 'importing', error: null },
    ]);
    const stored = await server.pool.query('select count(*)::int as n from observations where upload_id = $1', [gone!.id]);
    expect(stored.rows[0].n).toBe(0);
    // A second sweep changes nothing.
    expect(await sweepOrphanedImports(server.pool)).toEqual([]);
  });

  it('deletes the file of a cancelled upload whose running import never noticed, and leaves its status', async () => {
    const folder = await mkdtemp(join(tmpdir(), 'lw-sweep-'));
    const path = join(folder, 'left-behind.csv');
    await writeFile(path, 'timestamp,kW\n2020-01-01T00:00:00Z,1\n');
    const error = 'Cancelled by Test steward while importing; nothing from this file was stored.';
    const [left] = await server.db
      .insert(uploads)
      .values({
        fileName: 'left-behind.csv',
        contentSha256: 'sha-left-behind',
        byteSize: 10,
        status: 'cancelled',
        storagePath: path,
        error,
      })
      .returning({ id: uploads.id });
    await server.pool.query(`update uploads set updated_at = now() - interval '5 minutes' where id = $1`, [left!.id]);

    expect(await sweepOrphanedImports(server.pool)).toEqual([]);

    expect(existsSync(path)).toBe(false);
    const { rows } = await server.pool.query('select status, error, storage_path from uploads where id = $1', [left!.id]);
    expect(rows).toEqual([{ status: 'cancelled', error, storage_path: null }]);
    await rm(folder, { recursive: true, force: true });
  });
});
