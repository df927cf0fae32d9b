/** Model settings per series and the holiday calendar through the API: validation, access, audit. */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { seriesId } from './support';

let server: TestServer;
let planner: SignedIn;
let viewer: SignedIn;
let steward: SignedIn;

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db);
  planner = await signIn(server.url, people.planner.email);
  viewer = await signIn(server.url, people.viewer.email);
  steward = await signIn(server.url, people.steward.email);
}, 120_000);

afterAll(async () => {
  await server?.close();
});

/** A write as `who`. */
const write = (who: SignedIn, method: 'put' | 'post' | 'delete', path: string) =>
  request(server.url)[method](path).set('Cookie', who.cookie).set('X-CSRF-Token', who.csrf);

describe('model settings', () => {
  it('reads the defaults of a load series with its linked weather station', async () => {
    const id = await seriesId(server.pool, 'zone-north');
    const response = await request(server.url).get(`/api/series/${id}/model`).set('Cookie', viewer.cookie);
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({
      seriesId: id,
      method: 'auto',
      seasonal: { kind: 'profile', slot: 'hour-of-week', form: 'additive' },
      log: false,
      temperature: { enabled: true, heatingBase: null, coolingBase: null },
      dayTypes: true,
      trainingWindowDays: 365,
      horizonHours: 168,
      levels: [80, 95],
      temperatureSeries: { key: 'wx-upland', unit: 'degF' },
      updatedBy: null,
    });
  });

  it('lets a planner change them, audits before and after, and refuses a viewer or steward', async () => {
    const id = await seriesId(server.pool, 'zone-south');
    const current = (await request(server.url).get(`/api/series/${id}/model`).set('Cookie', planner.cookie)).body;
    const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...editable } = current;
    const next = {
      ...editable,
      method: 'lasso',
      arOrder: 24,
      extraLags: [168],
      seasonal: { kind: 'difference', lag: 24 },
      log: true,
      temperature: { enabled: true, heatingBase: 58, coolingBase: 75 },
      levels: [50, 80, 95],
    };
    expect((await write(viewer, 'put', `/api/series/${id}/model`).send(next)).status).toBe(403);
    expect((await write(steward, 'put', `/api/series/${id}/model`).send(next)).status).toBe(403);
    const saved = await write(planner, 'put', `/api/series/${id}/model`).send(next);
    expect(saved.status).toBe(200);
    expect(saved.body).toMatchObject({ ...next, updatedBy: 'Test planner' });
    const again = await request(server.url).get(`/api/series/${id}/model`).set('Cookie', viewer.cookie);
    expect(again.body).toMatchObject(next);
    const { rows } = await server.pool.query(`select detail from audit_log where action = 'model.settings_changed' and target_id = $1`, [
      String(id),
    ]);
    expect(rows).toHaveLength(1);
    expect(rows[0].detail.before).toMatchObject({ method: 'auto', log: false });
    expect(rows[0].detail.after).toMatchObject({ method: 'lasso', log: true, seasonal: { kind: 'difference', lag: 24 } });
  });

  it('rejects inconsistent settings with pointers to the fields', async () => {
    const id = await seriesId(server.pool, 'zone-central');
    const base = (await request(server.url).get(`/api/series/${id}/model`).set('Cookie', planner.cookie)).body;
    const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...editable } = base;
    const cases: Array<[object, string]> = [
      [{ method: 'cmle', maOrder: 1 }, '/maOrder'],
      [{ levels: [80, 80] }, '/levels'],
      [{ temperature: { enabled: true, heatingBase: 80, coolingBase: 60 } }, '/temperature/coolingBase'],
      [{ method: 'seasonal-naive' }, '/seasonal'],
      [{ horizonHours: 0 }, '/horizonHours'],
      [{ seasonal: { kind: 'difference', lag: 12 } }, '/seasonal/lag'],
    ];
    for (const [change, pointer] of cases) {
      const response = await write(planner, 'put', `/api/series/${id}/model`).send({ ...editable, ...change });
      expect(response.status, JSON.stringify(change)).toBe(400);
      expect(
        response.body.errors.map((e: { pointer: string }) => e.pointer),
        JSON.stringify(change),
      ).toContain(pointer);
    }
  });

  it('answers 404 for a temperature series or an unknown id', async () => {
    const station = await seriesId(server.pool, 'wx-upland');
    expect((await request(server.url).get(`/api/series/${station}/model`).set('Cookie', viewer.cookie)).status).toBe(404);
    expect((await request(server.url).get('/api/series/999999/model').set('Cookie', viewer.cookie)).status).toBe(404);
    expect((await request(server.url).get(`/api/series/${station}/fit`).set('Cookie', viewer.cookie)).status).toBe(404);
  });
});

describe('the holiday calendar', () => {
  it("lists the seeded public holidays with the organisation's country", async () => {
    const response = await request(server.url).get('/api/holidays?from=2025-01-01&to=2025-12-31').set('Cookie', viewer.cookie);
    expect(response.status).toBe(200);
    expect(response.body.country).toBe('US');
    const christmas = response.body.holidays.find((h: { day: string }) => h.day === '2025-12-25');
    expect(christmas).toMatchObject({ source: 'package', kind: 'public' });
  });

  it('lets a planner add and remove a day, refusing duplicates and viewers', async () => {
    const day = { day: '2026-12-24', name: 'Plant shutdown', kind: 'company' };
    expect((await write(viewer, 'post', '/api/holidays').send(day)).status).toBe(403);
    const added = await write(planner, 'post', '/api/holidays').send(day);
    expect(added.status).toBe(201);
    expect(added.body).toMatchObject({ ...day, source: 'manual' });
    expect((await write(planner, 'post', '/api/holidays').send(day)).status).toBe(409);
    const listed = await request(server.url).get('/api/holidays?from=2026-12-24&to=2026-12-24').set('Cookie', viewer.cookie);
    expect(listed.body.holidays.map((h: { name: string }) => h.name)).toContain('Plant shutdown');
    expect((await write(planner, 'delete', `/api/holidays/${added.body.id}`)).status).toBe(204);
    expect((await write(planner, 'delete', `/api/holidays/${added.body.id}`)).status).toBe(404);
    const actions = await server.pool.query(`select action from audit_log where action like 'holiday.%' order by id`);
    expect(actions.rows.map((r) => r.action)).toEqual(['holiday.added', 'holiday.removed']);
  });

  it('seeds a year from the holiday package once', async () => {
    const first = await write(planner, 'post', '/api/holidays/seed').send({ years: [2031] });
    expect(first.status).toBe(200);
    expect(first.body.added).toBeGreaterThan(5);
    const second = await write(planner, 'post', '/api/holidays/seed').send({ years: [2031] });
    expect(second.body.added).toBe(0);
    const listed = await request(server.url).get('/api/holidays?from=2031-07-04&to=2031-07-04').set('Cookie', viewer.cookie);
    expect(listed.body.holidays).toHaveLength(1);
  });
});

describe('starting refits', () => {
  it('is for planners, and answers 503 while no worker has set up the queue', async () => {
    expect((await write(viewer, 'post', '/api/refits').send({ scope: { kind: 'all' } })).status).toBe(403);
    const missing = await write(planner, 'post', '/api/refits').send({ scope: { kind: 'series', seriesIds: [999999] } });
    expect(missing.status).toBe(503);
    const current = await request(server.url).get('/api/refits/current').set('Cookie', viewer.cookie);
    expect(current.body).toEqual({ run: null });
  });
});
