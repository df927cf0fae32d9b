/**
 * The refit worker end to end: real PostgreSQL, the demo co-op, the in-process worker on pg-boss.
 * Manual runs for one series and a zone group, the nightly schedule, idempotence under duplicated jobs,
 * a failure inside the write transaction, bad data, temperature forecasts and interval ordering.
 */
import PgBoss from 'pg-boss';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBoss } from '../../jobs/boss';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { refitNightlyQueue, refitSeriesQueue } from '@loadwright/refits';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { sweepOrphanedRefits } from '../../jobs/refit-sweeper';
import { seriesId, versionsOf, waitFor, waitForRun } from './support';

let server: TestServer;
let planner: SignedIn;
let viewer: SignedIn;
let sender: PgBoss;

beforeAll(async () => {
  // One quick retry, so failure paths settle in seconds.
  process.env['REFIT_RETRY_LIMIT'] = '1';
  process.env['REFIT_RETRY_DELAY_SECONDS'] = '1';
  // The demo is seeded after the worker started: it must pick up the co-op's time zone by itself.
  process.env['REFIT_SCHEDULE_CHECK_SECONDS'] = '1';
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db);
  planner = await signIn(server.url, people.planner.email);
  viewer = await signIn(server.url, people.viewer.email);
  sender = createBoss(server.databaseUrl, { supervise: false });
  await sender.start();
}, 120_000);

afterAll(async () => {
  await sender?.stop({ wait: false });
  await server?.close();
  delete process.env['REFIT_RETRY_LIMIT'];
  delete process.env['REFIT_RETRY_DELAY_SECONDS'];
  delete process.env['REFIT_SCHEDULE_CHECK_SECONDS'];
});

/** Starts a manual run through the API as the planner; returns its id. */
async function startRun(scope: object): Promise<number> {
  const response = await request(server.url)
    .post('/api/refits')
    .set('Cookie', planner.cookie)
    .set('X-CSRF-Token', planner.csrf)
    .send({ scope });
  expect(response.status, JSON.stringify(response.body)).toBe(202);
  return response.body.id;
}

describe('a manual run for one series', () => {
  let runId: number;
  let id: number;

  beforeAll(async () => {
    id = await seriesId(server.pool, 'zone-north');
    runId = await startRun({ kind: 'series', seriesIds: [id] });
    await waitForRun(server.pool, runId);
  }, 90_000);

  it('writes one draft version with a week of hourly points', async () => {
    const versions = await versionsOf(server.pool, id);
    expect(versions).toHaveLength(1);
    expect(versions[0]).toMatchObject({ state: 'draft', refit_run_id: runId });
    const { rows } = await server.pool.query(
      'select count(*)::int as n, min(ts) as first, max(ts) as last from forecast_points where version_id = $1',
      [versions[0]!.id],
    );
    expect(rows[0].n).toBe(168);
    const lastActual = await server.pool.query('select max(ts) as ts from observations where series_id = $1', [id]);
    expect(rows[0].first.getTime()).toBe(lastActual.rows[0].ts.getTime() + 3_600_000);
    expect(rows[0].last.getTime() - rows[0].first.getTime()).toBe(167 * 3_600_000);
  });

  it('orders the 80 % and 95 % bands around the mean at every hour', async () => {
    const [version] = await versionsOf(server.pool, id);
    const { rows } = await server.pool.query(
      'select mean, std_error, lower_80, upper_80, lower_95, upper_95 from forecast_points where version_id = $1 order by ts',
      [version!.id],
    );
    for (const p of rows) {
      expect(p.lower_95).toBeLessThanOrEqual(p.lower_80);
      expect(p.lower_80).toBeLessThanOrEqual(p.mean);
      expect(p.mean).toBeLessThanOrEqual(p.upper_80);
      expect(p.upper_80).toBeLessThanOrEqual(p.upper_95);
      expect(p.std_error).toBeGreaterThan(0);
    }
    // The bands widen with the horizon.
    expect(rows[167].upper_95 - rows[167].lower_95).toBeGreaterThan(rows[0].upper_95 - rows[0].lower_95);
  });

  it("records auto's candidate table, residual checks and the temperature fallback in the fit", async () => {
    const fit = await request(server.url).get(`/api/series/${id}/fit`).set('Cookie', viewer.cookie);
    expect(fit.status).toBe(200);
    const labels = fit.body.selection.candidates.map((c: { label: string }) => c.label);
    expect(labels).toContain('seasonal naive (same hour last week)');
    expect(labels.some((l: string) => /^hour-of-week profile \+ AR\(\d\) by least squares$/.test(l))).toBe(true);
    expect(labels.some((l: string) => l.startsWith('weekly difference + AR('))).toBe(true);
    expect(fit.body.selection.candidates.filter((c: { chosen: boolean }) => c.chosen)).toHaveLength(1);
    expect(fit.body.selection.reason.length).toBeGreaterThan(20);
    // 14 daily origins when the window leaves five weeks to estimate on, none (AIC only) otherwise.
    expect([0, 14]).toContain(fit.body.selection.backtest.origins);
    expect(fit.body.selection.backtest.horizon).toBe(24);
    // The kind of band the forecast carries is recorded with the fit and with the version.
    expect(['empirical', 'gaussian']).toContain(fit.body.diagnostics.bands.kind);
    const stored = await server.pool.query(`select band_kind, bands from forecast_versions where series_id = $1 and state = 'draft'`, [id]);
    expect(stored.rows[0].band_kind).toBe(fit.body.diagnostics.bands.kind);
    expect(stored.rows[0].bands.reason).toBe(fit.body.diagnostics.bands.reason);
    // Every estimated model reports its standard errors next to its estimates (seasonal naive estimates nothing; the
    // lasso has no simple standard errors, Tibshirani 1996 §2.5, and records none).
    if (fit.body.method !== 'seasonal-naive' && fit.body.method !== 'lasso') {
      expect(fit.body.parameters.standardErrors.ar).toHaveLength(fit.body.arOrder);
      for (const se of fit.body.parameters.standardErrors.ar.filter((v: number | null) => v !== null)) expect(se).toBeGreaterThan(0);
    }
    expect(fit.body.diagnostics.residualAcf).toHaveLength(48);
    expect(fit.body.diagnostics.ljungBox.pValue).toBeGreaterThanOrEqual(0);
    // The demo ships a week of station forecasts issued each morning: the latest covers the horizon, no fallback.
    expect(fit.body.diagnostics.warnings.map((w: { code: string }) => w.code)).not.toContain('temperature-fallback');
    if (fit.body.diagnostics.temperature.used)
      expect(fit.body.diagnostics.temperature.reason).toContain('forecast issued 2026-11-30 12:00 UTC (168 of 168 hours)');
    else expect(fit.body.diagnostics.temperature.reason).toMatch(/seasonal naive/);
    const [version] = await versionsOf(server.pool, id);
    expect(version!.warnings.map((w) => w.code)).not.toContain('temperature-fallback');
  });

  it('reports the run and its series through the status API with phase times', async () => {
    const detail = await request(server.url).get(`/api/refits/${runId}`).set('Cookie', viewer.cookie);
    expect(detail.status).toBe(200);
    expect(detail.body).toMatchObject({
      id: runId,
      trigger: 'manual',
      state: 'finished',
      requestedBy: 'Test planner',
      counts: { total: 1, done: 1, failed: 0, queued: 0, running: 0 },
    });
    const [row] = detail.body.series;
    expect(row).toMatchObject({ seriesId: id, seriesKey: 'zone-north', status: 'done', attempts: 1, error: null });
    expect(row.versionId).toBeGreaterThan(0);
    for (const phase of ['read', 'fit', 'diagnose', 'forecast', 'write']) expect(row.phaseMs[phase]).toBeGreaterThanOrEqual(0);
    const list = await request(server.url).get('/api/refits').set('Cookie', viewer.cookie);
    expect(list.body.runs[0].id).toBe(runId);
  });
});

describe('refit scopes', () => {
  it('names series that do not exist and refuses weather stations', async () => {
    const missing = await request(server.url)
      .post('/api/refits')
      .set('Cookie', planner.cookie)
      .set('X-CSRF-Token', planner.csrf)
      .send({ scope: { kind: 'series', seriesIds: [999999] } });
    expect(missing.status).toBe(404);
    expect(missing.body.detail).toContain('999999');
    const station = await seriesId(server.pool, 'wx-upland');
    const refused = await request(server.url)
      .post('/api/refits')
      .set('Cookie', planner.cookie)
      .set('X-CSRF-Token', planner.csrf)
      .send({ scope: { kind: 'subtree', seriesId: station } });
    expect(refused.status).toBe(400);
  });
});

describe('a manual run for a zone and everything below it', () => {
  it('refits the zone and its substations and feeders, superseding earlier drafts', async () => {
    const zone = await seriesId(server.pool, 'zone-north');
    const { rows: tree } = await server.pool.query(
      `with recursive t as (select id from series where id = $1 union all select s.id from series s join t on s.parent_id = t.id) select id from t`,
      [zone],
    );
    const runId = await startRun({ kind: 'subtree', seriesId: zone });
    const run = await waitForRun(server.pool, runId, 120_000);
    expect(run.series_total).toBe(tree.length);
    expect(run.series_done).toBe(tree.length);
    const zoneVersions = await versionsOf(server.pool, zone);
    expect(zoneVersions.map((v) => v.state)).toEqual(['superseded', 'draft']);
    expect(zoneVersions[1]!.refit_run_id).toBe(runId);
    const drafts = await server.pool.query(
      `select series_id, count(*)::int as n from forecast_versions where state = 'draft' group by series_id having count(*) > 1`,
    );
    expect(drafts.rows).toEqual([]);
  }, 150_000);
});

describe('the nightly schedule', () => {
  it("is registered at the refit hour in the organisation's time zone, and follows changes to it", async () => {
    const scheduled = async (tz: string, cron: string) =>
      waitFor(
        async () => {
          const { rows } = await server.pool.query('select cron, options from pgboss.schedule where name = $1', [refitNightlyQueue]);
          return rows.length === 1 && rows[0].cron === cron && rows[0].options.tz === tz ? true : undefined;
        },
        `the schedule ${cron} in ${tz}`,
        15_000,
      );
    await scheduled('America/Chicago', '0 2 * * *');
    await server.pool.query('update organisation set refit_hour = 4');
    await scheduled('America/Chicago', '0 4 * * *');
    await server.pool.query('update organisation set refit_hour = 2');
    await scheduled('America/Chicago', '0 2 * * *');
  }, 40_000);

  it('fans out one job per active load series when it fires, once per fire time', async () => {
    const { rows: active } = await server.pool.query(`select count(*)::int as n from series where kind = 'load' and archived_at is null`);
    // Deliver the schedule's job exactly as pg-boss's cron does, twice for the same minute.
    while (new Date().getSeconds() > 55) await new Promise((done) => setTimeout(done, 500));
    await sender.send(refitNightlyQueue, {});
    await sender.send(refitNightlyQueue, {});
    const run = await waitFor(async () => {
      const { rows } = await server.pool.query(`select id, series_total from refit_runs where trigger = 'schedule'`);
      return rows.length > 0 ? rows : undefined;
    }, 'a scheduled run');
    const finished = await waitForRun(server.pool, run[0].id, 240_000);
    expect(finished.series_total).toBe(active[0].n);
    expect(finished.series_done + finished.series_failed).toBe(active[0].n);
    expect(finished.series_done).toBeGreaterThanOrEqual(active[0].n - 1);
    const { rows: runs } = await server.pool.query(`select id from refit_runs where trigger = 'schedule'`);
    expect(runs).toHaveLength(1);
  }, 300_000);
});

describe('duplicated jobs', () => {
  it('write one version for a run and series, however often the job arrives', async () => {
    const id = await seriesId(server.pool, 'zone-south');
    const runId = await startRun({ kind: 'series', seriesIds: [id] });
    // Two more copies of the same job, racing the first.
    await sender.insert([
      { name: refitSeriesQueue, data: { runId, seriesId: id } },
      { name: refitSeriesQueue, data: { runId, seriesId: id } },
    ]);
    await waitForRun(server.pool, runId);
    await waitFor(async () => {
      const { rows } = await server.pool.query(
        `select count(*)::int as n from pgboss.job where name = $1 and data->>'runId' = $2 and state < 'completed'`,
        [refitSeriesQueue, String(runId)],
      );
      return rows[0].n === 0 ? true : undefined;
    }, 'every copy of the job to be handled');
    const { rows } = await server.pool.query(
      'select count(*)::int as n from forecast_versions where refit_run_id = $1 and series_id = $2',
      [runId, id],
    );
    expect(rows[0].n).toBe(1);
    const fits = await server.pool.query('select count(*)::int as n from refit_run_series where run_id = $1 and status = $2', [
      runId,
      'done',
    ]);
    expect(fits.rows[0].n).toBe(1);
  }, 90_000);
});

describe('a failure inside the write transaction', () => {
  it('leaves no half-written version, marks the series failed and keeps the previous draft', async () => {
    const id = await seriesId(server.pool, 'zone-central');
    const firstRun = await startRun({ kind: 'series', seriesIds: [id] });
    await waitForRun(server.pool, firstRun);
    const before = await versionsOf(server.pool, id);
    const draft = before.find((v) => v.state === 'draft')!;
    expect(draft.refit_run_id).toBe(firstRun);
    const fitsBefore = (await server.pool.query('select count(*)::int as n from fits where series_id = $1', [id])).rows[0].n;
    // Fail every write of this series right after its points are inserted, as a crash would.
    await server.pool.query(`create function fail_after_points() returns trigger language plpgsql as $$
      begin
        if exists (select 1 from new_rows n join forecast_versions v on v.id = n.version_id where v.series_id = ${id}) then
          raise exception 'simulated crash after the points were written';
        end if;
        return null;
      end $$`);
    await server.pool.query(
      'create trigger fail_after_points after insert on forecast_points referencing new table as new_rows for each statement execute function fail_after_points()',
    );
    try {
      const runId = await startRun({ kind: 'series', seriesIds: [id] });
      const run = await waitForRun(server.pool, runId, 90_000);
      expect(run.series_failed).toBe(1);
      const { rows } = await server.pool.query('select status, attempts, error from refit_run_series where run_id = $1', [runId]);
      expect(rows[0]).toMatchObject({ status: 'failed', attempts: 2 });
      expect(rows[0].error).toContain('simulated crash');
      expect((await server.pool.query('select count(*)::int as n from forecast_versions where refit_run_id = $1', [runId])).rows[0].n).toBe(
        0,
      );
      expect((await server.pool.query('select count(*)::int as n from fits where series_id = $1', [id])).rows[0].n).toBe(fitsBefore);
      const after = await versionsOf(server.pool, id);
      expect(after).toEqual(before);
      const points = await server.pool.query('select count(*)::int as n from forecast_points where version_id = $1', [draft.id]);
      expect(points.rows[0].n).toBe(168);
    } finally {
      await server.pool.query('drop trigger fail_after_points on forecast_points');
      await server.pool.query('drop function fail_after_points()');
    }
  }, 150_000);
});

describe('series with bad data', () => {
  it('fail with a clear error at once, and a series that had a good forecast keeps it', async () => {
    const good = await seriesId(server.pool, 'zone-south');
    const keptDraft = (await versionsOf(server.pool, good)).find((v) => v.state === 'draft')!;
    // Every reading of the series excluded by a steward: nothing left to train on.
    await server.pool.query('update observations set quality = quality | 512 where series_id = $1', [good]);
    const parent = await seriesId(server.pool, 'sys');
    const { rows: made } = await server.pool.query(
      `insert into series (key, name, kind, level, parent_id, unit, time_zone) values
         ('flat-feeder', 'Flat feeder', 'load', 'feeder', $1, 'kW', 'America/Chicago'),
         ('young-feeder', 'Young feeder', 'load', 'feeder', $1, 'kW', 'America/Chicago') returning id, key`,
      [parent],
    );
    const flat = made.find((r) => r.key === 'flat-feeder')!.id;
    const young = made.find((r) => r.key === 'young-feeder')!.id;
    await server.pool.query(
      `insert into observations (series_id, ts, value) select $1, g, 250 from generate_series(timestamptz '2026-10-01', timestamptz '2026-11-30 23:00', interval '1 hour') g`,
      [flat],
    );
    await server.pool.query(
      `insert into observations (series_id, ts, value) select $1, g, 100 + extract(hour from g) from generate_series(timestamptz '2026-11-26', timestamptz '2026-11-30 23:00', interval '1 hour') g`,
      [young],
    );
    try {
      const runId = await startRun({ kind: 'series', seriesIds: [good, flat, young] });
      const run = await waitForRun(server.pool, runId, 60_000);
      expect(run.series_failed).toBe(3);
      const detail = await request(server.url).get(`/api/refits/${runId}`).set('Cookie', viewer.cookie);
      const byKey = Object.fromEntries(detail.body.series.map((s: { seriesKey: string }) => [s.seriesKey, s]));
      expect(byKey['flat-feeder']).toMatchObject({ status: 'failed', attempts: 1 });
      expect(byKey['flat-feeder'].error).toMatch(/same value \(250\) in every hour/);
      expect(byKey['young-feeder'].error).toMatch(/120 usable hours .* at least 336/);
      expect(byKey['zone-south'].error).toMatch(/0 usable hours/);
      const versions = await versionsOf(server.pool, good);
      expect(versions.find((v) => v.state === 'draft')).toEqual(keptDraft);
    } finally {
      await server.pool.query('update observations set quality = quality & ~512 where series_id = $1', [good]);
    }
  }, 90_000);
});

describe('temperature forecasts', () => {
  it("are used when the station's readings cover the horizon", async () => {
    const id = await seriesId(server.pool, 'sys');
    const { rows } = await server.pool.query('select temperature_series_id as station from series where id = $1', [id]);
    const station = rows[0].station;
    // A week of forecast temperatures after the last actual: yesterday's shape repeated.
    await server.pool.query(
      `insert into observations (series_id, ts, value)
       select $1, o.ts + interval '7 days', o.value from observations o
        where o.series_id = $1 and o.ts > (select max(ts) from observations where series_id = $1) - interval '7 days'`,
      [station],
    );
    // A fixed method, so the regression on degree-hours is part of the model whatever auto would pick.
    const settings = await request(server.url).get(`/api/series/${id}/model`).set('Cookie', planner.cookie);
    const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...editable } = settings.body;
    const put = await request(server.url)
      .put(`/api/series/${id}/model`)
      .set('Cookie', planner.cookie)
      .set('X-CSRF-Token', planner.csrf)
      .send({ ...editable, method: 'cmle', arOrder: 3 });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    const runId = await startRun({ kind: 'series', seriesIds: [id] });
    await waitForRun(server.pool, runId);
    const fit = await request(server.url).get(`/api/series/${id}/fit`).set('Cookie', viewer.cookie);
    expect(fit.body.diagnostics.temperature).toMatchObject({ used: true });
    expect(fit.body.diagnostics.warnings.map((w: { code: string }) => w.code)).not.toContain('temperature-fallback');
    expect(fit.body.parameters.regression.names).toEqual(expect.arrayContaining(['heating-degree-hours', 'cooling-degree-hours']));
  }, 90_000);
});

describe('a series whose job is gone from the queue', () => {
  it('is marked failed by the sweep so the run finishes', async () => {
    const id = await seriesId(server.pool, 'zone-north');
    const { rows } = await server.pool.query(
      `insert into refit_runs (trigger, series_total, started_at) values ('manual', 1, now()) returning id`,
    );
    const runId = rows[0].id;
    // As if its worker died in the last attempt and the queue expired the job: running, no live job.
    await server.pool.query(
      `insert into refit_run_series (run_id, series_id, status, attempts, queued_at, started_at) values ($1, $2, 'running', 2, now() - interval '20 minutes', now() - interval '15 minutes')`,
      [runId, id],
    );
    expect(await sweepOrphanedRefits(server.pool)).toBeGreaterThanOrEqual(1);
    const run = await waitForRun(server.pool, runId, 5_000);
    expect(run.series_failed).toBe(1);
    const { rows: series } = await server.pool.query('select status, error from refit_run_series where run_id = $1', [runId]);
    expect(series[0].status).toBe('failed');
    expect(series[0].error).toMatch(/worker stopped/);
    expect(await sweepOrphanedRefits(server.pool)).toBe(0);
  });
});
