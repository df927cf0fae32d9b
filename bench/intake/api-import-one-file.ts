/**
 * One import through the product end to end, as a steward's browser drives it, for the
 * `import-through-api` benchmark: the API in this process, a worker in a process of its own (as
 * `npm start` runs them), a fresh database with the same 12 hourly load series and the same file as
 * import-one-file.ts. Times each step a steward waits for and prints one JSON line:
 *   upload   POST /api/uploads (multipart body streamed to disk, SHA-256, sniff, mapping proposal)
 *   confirm  POST /api/uploads/:id/mapping (plan check, job enqueued in the upload's transaction)
 *   queued   from the confirmation until the worker starts the import (pg-boss polling)
 *   import   the worker's import, from the upload row's started_at to finished_at, and its stages as
 *            the worker recorded them in the audit entry (read, screen, validate, write, findings)
 *   noticed  from finished_at until the steward's poll (every 250 ms) sees "done"
 *
 * Usage: node --import tsx bench/intake/api-import-one-file.ts --rows 1000000
 */
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { openAsBlob } from 'node:fs';
import { rm, stat } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { createDb, series, users } from '../../libs/db/src';
import { migrate } from '../../libs/db/src/migrate';
import { pino } from 'pino';
import { createApp } from '../../apps/api/src/app';
import { hashPassword } from '../../apps/api/src/auth/passwords';
import { createDatabase, dropDatabase, ensurePostgres } from '../../scripts/postgres';
import { writeLoadFile } from './load-file';

const { values: args } = parseArgs({ options: { rows: { type: 'string', default: '1000000' } } });
const rows = Number(args.rows);
const seriesCount = 12;
const repoRoot = resolve(import.meta.dirname, '../..');
const password = 'bench password for the steward';

const { adminUrl } = await ensurePostgres();
const name = `lw_bench_api_import_${process.pid}`;
await createDatabase(adminUrl, name);
const url = new URL(adminUrl);
url.pathname = `/${name}`;
const databaseUrl = url.toString();
const path = join(tmpdir(), `lw-bench-api-import-${process.pid}.csv`);
const uploadFolder = join(tmpdir(), `lw-bench-api-uploads-${process.pid}`);
const worker = spawn(process.execPath, ['--import', 'tsx', 'jobs/worker.ts'], {
  cwd: repoRoot,
  env: { ...process.env, DATABASE_URL: databaseUrl, WORKER_NAME: 'bench-worker', LOG_LEVEL: 'warn' },
  stdio: ['ignore', 'ignore', 'inherit'],
});
const { db, pool, close } = createDb(databaseUrl, { max: 5 });
try {
  await migrate(databaseUrl);
  await db.insert(series).values(
    Array.from({ length: seriesCount }, (_, i) => ({
      key: `fdr-${i + 1}`,
      name: `Feeder ${i + 1}`,
      kind: 'load' as const,
      level: 'feeder' as const,
      unit: 'kW' as const,
      intervalMinutes: 60,
      timeZone: 'America/Chicago',
    })),
  );
  await db
    .insert(users)
    .values({ email: 'steward@bench.example', displayName: 'Bench steward', role: 'steward', passwordHash: await hashPassword(password) });
  const app = createApp({
    db,
    pool,
    logger: pino({ level: 'silent' }),
    sessionSecret: randomBytes(48),
    secureCookies: false,
    publicUrl: 'http://127.0.0.1',
    uploadFolder,
    uploadMaxBytes: 1024 * 1024 * 1024,
  });
  const server = app.listen(0, '127.0.0.1');
  await new Promise<void>((done) => server.once('listening', done));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

  const fileRows = await writeLoadFile(path, rows, seriesCount);
  const bytes = (await stat(path)).size;
  // The worker creates the import queue when it starts; the API refuses confirmations before that.
  for (let i = 0; i < 600; i++) {
    const { rows: found } = await pool
      .query(`select to_regclass('pgboss.queue') is not null and exists (select 1 from worker_heartbeats) as ready`)
      .catch(() => ({ rows: [{ ready: false }] }));
    if (found[0]?.ready) break;
    await new Promise((done) => setTimeout(done, 100));
  }

  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'steward@bench.example', password }),
  });
  if (signIn.status !== 200) throw new Error(`sign-in failed: ${signIn.status} ${await signIn.text()}`);
  const cookies = signIn.headers.getSetCookie().map((c) => c.split(';')[0]!);
  const csrf = cookies.find((c) => c.startsWith('lw_csrf='))!.slice('lw_csrf='.length);
  const headers = { cookie: cookies.join('; '), 'x-csrf-token': csrf };

  const t0 = performance.now();
  const form = new FormData();
  form.append('file', await openAsBlob(path), 'feeders-hourly.csv');
  const posted = await fetch(`${base}/api/uploads`, { method: 'POST', headers, body: form });
  const postedBody = (await posted.json()) as { upload: { id: number }; proposal: { mapping: unknown; settings: unknown } };
  if (posted.status !== 201) throw new Error(`upload failed: ${posted.status} ${JSON.stringify(postedBody)}`);
  const t1 = performance.now();
  const id = postedBody.upload.id;
  const confirmed = await fetch(`${base}/api/uploads/${id}/mapping`, {
    method: 'POST',
    headers: { ...headers, 'content-type': 'application/json' },
    body: JSON.stringify({ mapping: postedBody.proposal.mapping, settings: postedBody.proposal.settings }),
  });
  if (confirmed.status !== 200) throw new Error(`confirm failed: ${confirmed.status} ${await confirmed.text()}`);
  const t2 = performance.now();
  const confirmedAt = Date.now();
  let status = '';
  while (status !== 'done' && status !== 'failed') {
    await new Promise((done) => setTimeout(done, 250));
    const detail = (await (await fetch(`${base}/api/uploads/${id}`, { headers })).json()) as { upload: { status: string } };
    status = detail.upload.status;
  }
  const t3 = performance.now();
  const seenAt = Date.now();
  const { rows: timing } = await pool.query<{ started_at: Date; finished_at: Date; error: string | null }>(
    'select started_at, finished_at, error from uploads where id = $1',
    [id],
  );
  if (status !== 'done') throw new Error(`import ended ${status}: ${timing[0]?.error}`);
  const stored = Number((await pool.query('select count(*) as n from observations')).rows[0].n);
  const audit = await pool.query<{ detail: { stageSeconds: Record<string, number> } }>(
    `select detail from audit_log where action = 'upload.imported' and target_id = $1`,
    [String(id)],
  );
  const started = timing[0]!.started_at.getTime();
  const finished = timing[0]!.finished_at.getTime();
  server.closeAllConnections();
  server.close();
  const seconds = (t3 - t0) / 1000;
  console.log(
    JSON.stringify({
      rows: fileRows,
      fileBytes: bytes,
      stored,
      seconds,
      rowsPerSecond: Math.round(fileRows / seconds),
      uploadSeconds: (t1 - t0) / 1000,
      confirmSeconds: (t2 - t1) / 1000,
      queuedSeconds: (started - confirmedAt) / 1000,
      importSeconds: (finished - started) / 1000,
      noticedSeconds: (seenAt - finished) / 1000,
      importRowsPerSecond: Math.round(fileRows / ((finished - started) / 1000)),
      stages: audit.rows[0]?.detail.stageSeconds ?? null,
    }),
  );
} finally {
  worker.kill('SIGTERM');
  await new Promise((done) => worker.once('exit', done));
  await close();
  await rm(path, { force: true });
  await rm(uploadFolder, { recursive: true, force: true });
  await dropDatabase(adminUrl, name);
}
