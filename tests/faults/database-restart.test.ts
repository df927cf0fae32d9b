/**
 * PostgreSQL stopped in the middle of an import and started again, on a server of this test's own: the
 * worker process stays up (no unhandled 'error' event or rejection), the API answers 503 problems with
 * Retry-After while the database is away and recovers by itself, and the import is finished once, with
 * every reading stored exactly once. The same for a refit run: the worker survives the stop and every
 * series of the run is refitted exactly once.
 */
import { series } from '@loadwright/db';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { confirm, postFile, waitForImport } from '../intake/upload-client';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import {
  loadFile,
  loadFileSeries,
  startOwnPostgres,
  startWorker,
  stopWorker,
  waitFor,
  type OwnPostgres,
  type WorkerProcess,
} from './support';

let postgres: OwnPostgres;
let server: TestServer;
let steward: SignedIn;
let planner: SignedIn;
let worker: WorkerProcess;

// 30,000 hours × 12 series: several seconds of import, so the stop lands inside it.
const hours = 30_000;
const expectedRows = hours * loadFileSeries.length;
let uploadId: number;

beforeAll(async () => {
  postgres = await startOwnPostgres();
  server = await startTestServer({ worker: false, databaseUrl: postgres.url });
  const people = await createPeople(server.db);
  steward = await signIn(server.url, people.steward.email);
  planner = await signIn(server.url, people.planner.email);
  const load = { kind: 'load', level: 'feeder', unit: 'kW', intervalMinutes: 60, timeZone: 'UTC' } as const;
  await server.db.insert(series).values(loadFileSeries.map((key) => ({ key, name: `Test feeder ${key}`, ...load })));
  worker = startWorker(postgres.url, 'worker-a');
  await waitFor(async () => ((await request(server.url).get('/api/health')).body.workers?.ok ? true : undefined), 'the worker to beat');
}, 120_000);

afterAll(async () => {
  await stopWorker(worker);
  await server?.close();
  await postgres?.destroy();
});

describe('PostgreSQL stopped during an import', () => {
  beforeAll(async () => {
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
    await postgres.stop();
  }, 120_000);

  it('answers 503 with Retry-After on every endpoint that needs the database, and health says the database is down', async () => {
    for (const path of ['/api/uploads', '/api/series', `/api/uploads/${uploadId}`]) {
      const response = await request(server.url).get(path).set('Cookie', steward.cookie);
      expect(response.status, path).toBe(503);
      expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(response.headers['retry-after']).toBe('5');
      expect(response.body).toMatchObject({ type: '/problems/unavailable', status: 503 });
      expect(response.body.detail).toContain('The database cannot be reached');
    }
    const signIn = await request(server.url).post('/api/auth/sign-in').send({ email: 'steward@test.example', password: 'x' });
    expect(signIn.status).toBe(503);
    const health = await request(server.url).get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body.database.ok).toBe(false);
  });

  it('keeps the worker process running while the database is away', async () => {
    await new Promise((done) => setTimeout(done, 3_000));
    expect(worker.child.exitCode).toBeNull();
    expect(worker.child.signalCode).toBeNull();
  });

  it('recovers by itself once PostgreSQL is back: the API answers again and the import finishes once', async () => {
    await postgres.start();
    const back = await waitFor(
      async () => {
        const response = await request(server.url).get('/api/uploads').set('Cookie', steward.cookie);
        return response.status === 200 ? response : undefined;
      },
      'the API to answer again',
      30_000,
    );
    expect(back.status).toBe(200);
    const done = await waitForImport(server.url, steward, uploadId, 120_000);
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
    // The same worker process did it: it never crashed.
    expect(worker.child.exitCode).toBeNull();
    const health = await waitFor(
      async () => {
        const response = await request(server.url).get('/api/health');
        return response.status === 200 ? response.body : undefined;
      },
      'health to be ok again',
      30_000,
    );
    expect(health.workers.processes.filter((w: { live: boolean }) => w.live).map((w: { pid: number }) => w.pid)).toEqual([
      worker.child.pid,
    ]);
  }, 180_000);
});

describe('PostgreSQL stopped during a refit run', () => {
  let runId: number;
  let total: number;

  beforeAll(async () => {
    await seedDemo(postgres.url);
    // The demo co-op's load series (the test feeders hold 2015–2018 only, too old to refit).
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
    total = (await server.pool.query('select series_total from refit_runs where id = $1', [runId])).rows[0].series_total;
    await postgres.stop();
  }, 240_000);

  it('keeps the worker running while the database is away, then finishes the run with every series refitted once', async () => {
    await new Promise((done) => setTimeout(done, 3_000));
    expect(worker.child.exitCode).toBeNull();
    await postgres.start();
    const run = await waitFor(
      async () => {
        const { rows } = await server.pool
          .query('select series_done, series_failed, finished_at from refit_runs where id = $1', [runId])
          .catch(() => ({ rows: [{ finished_at: null }] }));
        return rows[0].finished_at ? rows[0] : undefined;
      },
      'the run to finish',
      240_000,
    );
    expect(run.series_failed).toBe(0);
    expect(run.series_done).toBe(total);
    const versions = await server.pool.query(
      `select series_id, count(*)::int as n from forecast_versions where refit_run_id = $1 group by series_id`,
      [runId],
    );
    expect(versions.rows).toHaveLength(total);
    expect(versions.rows.every((row) => row.n === 1)).toBe(true);
    // The same worker process did it: it never crashed.
    expect(worker.child.exitCode).toBeNull();
  }, 300_000);
});
