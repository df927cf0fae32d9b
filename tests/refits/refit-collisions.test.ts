/**
 * Refits of one series that meet: two runs' jobs of a series run one after the other on the real
 * worker, two writes forced to run at once both finish without a database error, a late retry of an
 * older run never replaces a newer run's draft, and a second run over every series is refused while
 * one is open.
 */
import PgBoss from 'pg-boss';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBoss } from '../../jobs/boss';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { refitSeries, refitSeriesKey, refitSeriesQueue, startRefitRun, type JobInserter } from '@loadwright/refits';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { seriesId, versionsOf, waitForRun } from './support';

let server: TestServer;
let planner: SignedIn;
let sender: PgBoss;
/** Starts runs without queueing their jobs, so a test decides when (and whether) each job runs. */
const noJobs: JobInserter = async () => {};

beforeAll(async () => {
  process.env['REFIT_RETRY_LIMIT'] = '1';
  process.env['REFIT_RETRY_DELAY_SECONDS'] = '1';
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db);
  planner = await signIn(server.url, people.planner.email);
  sender = createBoss(server.databaseUrl, { supervise: false });
  await sender.start();
}, 120_000);

afterAll(async () => {
  await sender?.stop({ wait: false });
  await server?.close();
  delete process.env['REFIT_RETRY_LIMIT'];
  delete process.env['REFIT_RETRY_DELAY_SECONDS'];
});

/** Starts a manual run through the API as the planner. */
function postRun(scope: object) {
  return request(server.url).post('/api/refits').set('Cookie', planner.cookie).set('X-CSRF-Token', planner.csrf).send({ scope });
}

/** The run-series row of one series in one run. */
async function runSeries(runId: number, id: number) {
  const { rows } = await server.pool.query(
    'select status, error, started_at, finished_at from refit_run_series where run_id = $1 and series_id = $2',
    [runId, id],
  );
  return rows[0] as { status: string; error: string | null; started_at: Date; finished_at: Date };
}

describe('two runs of one series', () => {
  it('queue behind each other on the worker and leave the newer run’s draft', async () => {
    const id = await seriesId(server.pool, 'fdr-n1');
    const first = await postRun({ kind: 'series', seriesIds: [id] });
    const second = await postRun({ kind: 'series', seriesIds: [id] });
    expect([first.status, second.status]).toEqual([202, 202]);
    const [a, b] = [first.body.id as number, second.body.id as number];
    await waitForRun(server.pool, a);
    await waitForRun(server.pool, b);

    const [rowA, rowB] = [await runSeries(a, id), await runSeries(b, id)];
    expect([rowA.status, rowB.status]).toEqual(['done', 'done']);
    // The worker takes two jobs at a time; the series key kept the second waiting until the first ended.
    const [earlier, later] = rowA.started_at <= rowB.started_at ? [rowA, rowB] : [rowB, rowA];
    expect(later.started_at.getTime()).toBeGreaterThanOrEqual(earlier.finished_at.getTime());
    const { rows: jobs } = await server.pool.query('select singleton_key, policy from pgboss.job where name = $1 and data->>$2 = $3', [
      refitSeriesQueue,
      'seriesId',
      String(id),
    ]);
    expect(jobs).toEqual([
      { singleton_key: refitSeriesKey(id), policy: 'singleton' },
      { singleton_key: refitSeriesKey(id), policy: 'singleton' },
    ]);

    const drafts = (await versionsOf(server.pool, id)).filter((version) => version.state === 'draft');
    expect(drafts.map((version) => version.refit_run_id)).toEqual([b]);
  }, 120_000);

  it('write one after the other when forced to run at once, with no database error', async () => {
    const id = await seriesId(server.pool, 'fdr-n2');
    const older = (await startRefitRun(server.pool, noJobs, {
      trigger: 'manual',
      scope: { kind: 'series', seriesIds: [id] },
      requestedById: null,
    }))!;
    const newer = (await startRefitRun(server.pool, noJobs, {
      trigger: 'manual',
      scope: { kind: 'series', seriesIds: [id] },
      requestedById: null,
    }))!;
    const attempt = { retryCount: 0, retryLimit: 0 };
    const results = await Promise.all([
      refitSeries(server.pool, older.runId, id, attempt),
      refitSeries(server.pool, newer.runId, id, attempt),
    ]);
    // Neither failed: the newer one wrote; the older one wrote first (then was superseded) or found the newer draft and kept nothing.
    expect(results.map((result) => result.written || result.reason)).not.toContain('failed');
    expect(results[1]).toMatchObject({ written: true });
    const drafts = (await versionsOf(server.pool, id)).filter((version) => version.state === 'draft');
    expect(drafts.map((version) => version.refit_run_id)).toEqual([newer.runId]);
    for (const runId of [older.runId, newer.runId]) expect((await runSeries(runId, id)).status).toBe('done');
  }, 120_000);

  it('never lets a late retry of an older run replace a newer run’s draft', async () => {
    const id = await seriesId(server.pool, 'fdr-n3');
    // The older run's job is held back, as a retry waiting out its backoff would be.
    const older = (await startRefitRun(server.pool, noJobs, {
      trigger: 'manual',
      scope: { kind: 'series', seriesIds: [id] },
      requestedById: null,
    }))!;
    const newer = await postRun({ kind: 'series', seriesIds: [id] });
    await waitForRun(server.pool, newer.body.id);
    const newerDraft = (await versionsOf(server.pool, id)).find((version) => version.state === 'draft')!;
    expect(newerDraft.refit_run_id).toBe(newer.body.id);

    await sender.send(refitSeriesQueue, { runId: older.runId, seriesId: id }, { singletonKey: refitSeriesKey(id) });
    await waitForRun(server.pool, older.runId);
    const late = await runSeries(older.runId, id);
    expect(late.status).toBe('done');
    expect(late.error).toBe(`Not kept: run ${newer.body.id} had already written a newer draft for this series.`);
    const versions = await versionsOf(server.pool, id);
    expect(versions.filter((version) => version.refit_run_id === older.runId)).toEqual([]);
    expect(versions.filter((version) => version.state === 'draft').map((version) => version.id)).toEqual([newerDraft.id]);
  }, 120_000);
});

describe('a run over every series', () => {
  it('is refused while another one is open, with a sentence that names the open run', async () => {
    const [one, two] = await Promise.all([postRun({ kind: 'all' }), postRun({ kind: 'all' })]);
    expect([one.status, two.status].sort()).toEqual([202, 409]);
    const started = one.status === 202 ? one.body.id : two.body.id;
    const refused = one.status === 409 ? one : two;
    expect(refused.body.detail).toMatch(
      new RegExp(`^Refit run ${started} over every series is still open \\(\\d+ of \\d+ series finished\\)`),
    );
    const { rows } = await server.pool.query(`select count(*)::int as n from refit_runs where scope->>'kind' = 'all'`);
    expect(rows[0].n).toBe(1);
    await waitForRun(server.pool, started, 180_000);
    const { rows: failed } = await server.pool.query(`select error from refit_run_series where run_id = $1 and status = 'failed'`, [
      started,
    ]);
    expect(failed.map((row) => row.error).join(' ')).not.toMatch(/forecast_versions_one_draft_key|duplicate key/);
  }, 240_000);
});
