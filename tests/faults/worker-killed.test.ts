/**
 * A worker killed outright (SIGKILL) in the middle of an import and in the middle of a refit run: its
 * jobs go back to the queue once its heartbeat stops (3 beats of 1 s here, 10 s in production), a
 * second worker process finishes them, and the database holds every row exactly once: no half-written
 * import, no duplicated reading, no second forecast version for a series in one run. An import a
 * steward cancels while its worker lies dead stays cancelled when another worker retries the job.
 */
import { existsSync } from 'node:fs';
import { series } from '@loadwright/db';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { confirm, postFile, waitForImport } from '../intake/upload-client';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { killWorker, loadFile, loadFileSeries, startWorker, stopWorker, waitFor, type WorkerProcess } from './support';

let server: TestServer;
let steward: SignedIn;
let planner: SignedIn;
let first: WorkerProcess | undefined;
let second: WorkerProcess | undefined;

/** Live workers as the health report lists them. */
async function liveWorkers(): Promise<Array<{ name: string; pid: number }>> {
  const report = await request(server.url).get('/api/health');
  return (report.body.workers?.processes ?? []).filter((worker: { live: boolean }) => worker.live);
}

/** Starts a worker and waits until the health report lists it as live. */
async function startLiveWorker(name: string): Promise<WorkerProcess> {
  const worker = startWorker(server.databaseUrl, name);
  await waitFor(async () => ((await liveWorkers()).some((w) => w.pid === worker.child.pid) ? true : undefined), `${name} to beat`);
  return worker;
}

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db);
  steward = await signIn(server.url, people.steward.email);
  planner = await signIn(server.url, people.planner.email);
  const load = { kind: 'load', level: 'feeder', unit: 'kW', intervalMinutes: 60, timeZone: 'UTC' } as const;
  await server.db.insert(series).values(loadFileSeries.map((key) => ({ key, name: `Test feeder ${key}`, ...load })));
}, 180_000);

afterAll(async () => {
  await stopWorker(first);
  await stopWorker(second);
  await server?.close();
});

describe('a worker killed during an import', () => {
  // 30,000 hours × 12 series: several seconds of import on two shared cores, so the kill lands inside it.
  const hours = 30_000;
  const expectedRows = hours * loadFileSeries.length;
  let uploadId: number;
  let killedAt: number;

  beforeAll(async () => {
    first = await startLiveWorker('worker-a');
    const posted = await postFile(server.url, steward, 'feeders-hourly.csv', loadFile(hours));
    expect(posted.status, JSON.stringify(posted.body)).toBe(201);
    uploadId = posted.body.upload.id;
    const confirmed = await confirm(server.url, steward, uploadId, {
      mapping: posted.body.proposal.mapping,
      settings: posted.body.proposal.settings,
    });
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(200);
    await waitFor(async () => {
      const { rows } = await server.pool.query('select status, progress from uploads where id = $1', [uploadId]);
      return rows[0].status === 'importing' && rows[0].progress > 0 ? true : undefined;
    }, 'the import to be under way');
    await killWorker(first);
    killedAt = Date.now();
  }, 120_000);

  it('leaves nothing of the interrupted attempt behind', async () => {
    const { rows } = await server.pool.query('select count(*)::int as n from observations where upload_id = $1', [uploadId]);
    expect(rows[0].n).toBe(0);
    const upload = await server.pool.query('select status from uploads where id = $1', [uploadId]);
    expect(upload.rows[0].status).toBe('importing');
  });

  it('is finished by another worker within a minute and a half, every reading stored once', async () => {
    second = await startLiveWorker('worker-b');
    const done = await waitForImport(server.url, steward, uploadId, 120_000);
    // Detection (3 missed beats of 1 s) + a reaper pass (1 s) + the import queue's retry delay (20 s) + the import itself.
    expect(Date.now() - killedAt).toBeLessThan(90_000);
    expect(done.upload.status).toBe('done');
    expect(done.upload.rowsImported).toBe(expectedRows);
    const { rows } = await server.pool.query(
      `select count(*)::int as n, count(distinct (series_id, ts))::int as distinct_n from observations where upload_id = $1`,
      [uploadId],
    );
    expect(rows[0]).toEqual({ n: expectedRows, distinct_n: expectedRows });
    const audit = await server.pool.query(`select count(*)::int as n from audit_log where action = 'upload.imported' and target_id = $1`, [
      String(uploadId),
    ]);
    expect(audit.rows[0].n).toBe(1);
  }, 150_000);

  it('counted the interrupted attempt as one retry of the job', async () => {
    const { rows } = await server.pool.query(
      `select retry_count, state from pgboss.job where name = 'import-upload' and data->>'uploadId' = $1`,
      [String(uploadId)],
    );
    expect(rows).toEqual([{ retry_count: 1, state: 'completed' }]);
  });
});

describe('an import cancelled while its worker lies dead', () => {
  // A different length from the file above, so its bytes are new to the upload list.
  const hours = 20_000;
  let uploadId: number;
  let path: string;
  let cancelledError: string;

  beforeAll(async () => {
    await stopWorker(second);
    const doomed = await startLiveWorker('worker-c');
    const posted = await postFile(server.url, steward, 'feeders-hourly-again.csv', loadFile(hours));
    expect(posted.status, JSON.stringify(posted.body)).toBe(201);
    uploadId = posted.body.upload.id;
    path = (await server.pool.query('select storage_path from uploads where id = $1', [uploadId])).rows[0].storage_path;
    const confirmed = await confirm(server.url, steward, uploadId, {
      mapping: posted.body.proposal.mapping,
      settings: posted.body.proposal.settings,
    });
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(200);
    await waitFor(async () => {
      const { rows } = await server.pool.query('select status, progress from uploads where id = $1', [uploadId]);
      return rows[0].status === 'importing' && rows[0].progress > 0 ? true : undefined;
    }, 'the import to be under way');
    await killWorker(doomed);
    const cancelled = await request(server.url)
      .post(`/api/uploads/${uploadId}/cancel`)
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf);
    expect(cancelled.status).toBe(200);
    expect(cancelled.body.status).toBe('cancelled');
    cancelledError = cancelled.body.error;
  }, 120_000);

  it('stays cancelled when the job is retried by another worker: no status rewritten, no row stored, the file deleted', async () => {
    second = await startLiveWorker('worker-d');
    const job = async () =>
      (
        await server.pool.query(`select state, retry_count from pgboss.job where name = 'import-upload' and data->>'uploadId' = $1`, [
          String(uploadId),
        ])
      ).rows[0] as { state: string; retry_count: number };
    // The retry runs once the dead worker's heartbeat is stale and the retry delay has passed.
    await waitFor(async () => ((await job()).state === 'completed' ? true : undefined), 'the retried job to complete', 120_000);
    expect(await job()).toEqual({ state: 'completed', retry_count: 1 });
    const { rows } = await server.pool.query('select status, error, storage_path from uploads where id = $1', [uploadId]);
    expect(rows[0]).toEqual({ status: 'cancelled', error: cancelledError, storage_path: null });
    expect(existsSync(path)).toBe(false);
    const stored = await server.pool.query('select count(*)::int as n from observations where upload_id = $1', [uploadId]);
    expect(stored.rows[0].n).toBe(0);
    const imported = await server.pool.query(
      `select count(*)::int as n from audit_log where action = 'upload.imported' and target_id = $1`,
      [String(uploadId)],
    );
    expect(imported.rows[0].n).toBe(0);
  }, 150_000);
});

describe('a worker killed during a refit run', () => {
  let runId: number;
  let total: number;

  beforeAll(async () => {
    second ??= await startLiveWorker('worker-b');
    // The demo co-op's load series (the test feeders above hold 2015–2018 only, too old to refit).
    const demo = await server.pool.query(`select id from series where kind = 'load' and key not like 'fdr-%' order by id`);
    const response = await request(server.url)
      .post('/api/refits')
      .set('Cookie', planner.cookie)
      .set('X-CSRF-Token', planner.csrf)
      .send({ scope: { kind: 'series', seriesIds: demo.rows.map((row) => row.id) } });
    expect(response.status, JSON.stringify(response.body)).toBe(202);
    runId = response.body.id;
    await waitFor(async () => {
      const { rows } = await server.pool.query(`select count(*)::int as n from refit_run_series where run_id = $1 and status = 'running'`, [
        runId,
      ]);
      return rows[0].n > 0 ? true : undefined;
    }, 'a series refit to be running');
    await killWorker(second);
    const { rows } = await server.pool.query('select series_total from refit_runs where id = $1', [runId]);
    total = rows[0].series_total;
    first = await startLiveWorker('worker-c');
  }, 120_000);

  it('finishes the run with every series refitted exactly once', async () => {
    const run = await waitFor(
      async () => {
        const { rows } = await server.pool.query('select series_done, series_failed, finished_at from refit_runs where id = $1', [runId]);
        return rows[0].finished_at ? rows[0] : undefined;
      },
      'the run to finish',
      240_000,
    );
    const failed = await server.pool.query(`select series_id, error from refit_run_series where run_id = $1 and status = 'failed'`, [
      runId,
    ]);
    expect(failed.rows).toEqual([]);
    expect(run.series_failed).toBe(0);
    expect(run.series_done).toBe(total);
    const versions = await server.pool.query(
      `select series_id, count(*)::int as n from forecast_versions where refit_run_id = $1 group by series_id having count(*) <> 1`,
      [runId],
    );
    expect(versions.rows).toEqual([]);
    const written = await server.pool.query(`select count(distinct series_id)::int as n from forecast_versions where refit_run_id = $1`, [
      runId,
    ]);
    expect(written.rows[0].n).toBe(total);
    // Each series keeps one draft at most: the interrupted attempt wrote nothing, so nothing was superseded twice.
    const drafts = await server.pool.query(
      `select series_id from forecast_versions where state = 'draft' group by series_id having count(*) > 1`,
    );
    expect(drafts.rows).toEqual([]);
  }, 300_000);

  it('counted a second attempt for the series the killed worker held', async () => {
    const { rows } = await server.pool.query(`select count(*)::int as n from refit_run_series where run_id = $1 and attempts > 1`, [runId]);
    expect(rows[0].n).toBeGreaterThan(0);
  });
});
