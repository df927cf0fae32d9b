/** The series catalogue API over the seeded demo co-op: listing, hierarchy, detail, edits and their rules. */
import { and, eq } from 'drizzle-orm';
import { auditLog, series } from '@loadwright/db';
import { seedDemo } from '../../libs/db/src/seed';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { createTokens, type Tokens } from './support/tokens';

let server: TestServer;
let steward: SignedIn;
let viewer: SignedIn;
let tokens: Tokens;
const ids = new Map<string, number>();

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db);
  steward = await signIn(server.url, people.steward.email);
  viewer = await signIn(server.url, people.viewer.email);
  tokens = await createTokens(server.db);
  for (const row of await server.db.select({ id: series.id, key: series.key }).from(series)) ids.set(row.key, row.id);
});
afterAll(() => server.close());

const api = () => request(server.url);
const asSteward = (test: request.Test) => test.set('Cookie', steward.cookie).set('X-CSRF-Token', steward.csrf);
const list = (query: Record<string, string | number>) => api().get('/api/series').query(query).set('Cookie', viewer.cookie);
const keysOf = (body: { items: { key: string }[] }) => body.items.map((item) => item.key);

/** A valid new feeder under zone-north; tests override fields. */
const newFeeder = (overrides: Record<string, unknown> = {}) => ({
  key: 'fdr-n5',
  name: 'N5 Kestrel Ridge Road',
  kind: 'load',
  level: 'feeder',
  parentId: ids.get('zone-north'),
  unit: 'kW',
  intervalMinutes: 15,
  timeZone: 'America/Chicago',
  temperatureSeriesId: ids.get('wx-upland'),
  ...overrides,
});

describe('listing', () => {
  it('lists the 18 live demo series by key with the total, to viewers and read tokens', async () => {
    const response = await list({ limit: 200 });
    expect(response.status).toBe(200);
    expect(response.body.total).toBe(18);
    expect(keysOf(response.body)).toEqual([...keysOf(response.body)].sort());
    const feeder = response.body.items.find((item: { key: string }) => item.key === 'fdr-n1');
    expect(feeder).toMatchObject({
      parentKey: 'zone-north',
      temperatureSeriesKey: 'wx-upland',
      unit: 'kW',
      level: 'feeder',
      intervalMinutes: 60,
      archivedAt: null,
      latestReadingAt: '2026-11-30T23:00:00.000Z',
    });
    const byToken = await api().get('/api/series').set('Authorization', `Bearer ${tokens.read}`);
    expect(byToken.status).toBe(200);
    expect(byToken.body.total).toBe(18);
  });

  it('pages without overlap and sorts by name, level and update time', async () => {
    const all = keysOf((await list({ limit: 200 })).body);
    const page2 = await list({ offset: 5, limit: 5 });
    expect(page2.body).toMatchObject({ total: 18, offset: 5, limit: 5 });
    expect(keysOf(page2.body)).toEqual(all.slice(5, 10));
    expect(keysOf((await list({ offset: 15, limit: 5 })).body)).toEqual(all.slice(15));

    const byName = (await list({ sort: 'name', order: 'desc', limit: 200 })).body.items.map((i: { name: string }) => i.name.toLowerCase());
    expect(byName).toEqual([...byName].sort().reverse());
    const byLevel = (await list({ sort: 'level', limit: 200 })).body.items.map((i: { level: string | null }) => i.level);
    expect(byLevel).toEqual(['system', ...Array(3).fill('zone'), ...Array(12).fill('feeder'), null, null]);
  });

  it('filters by kind, level and text in key or name', async () => {
    expect(keysOf((await list({ kind: 'temperature' })).body)).toEqual(['wx-lowland', 'wx-upland']);
    expect((await list({ level: 'feeder' })).body.total).toBe(12);
    expect(keysOf((await list({ q: 'harrow' })).body)).toEqual(['fdr-n1', 'fdr-n2']);
    expect(keysOf((await list({ q: 'ZONE-S' })).body)).toEqual(['zone-south']);
    // LIKE wildcards in the search text are taken literally.
    expect((await list({ q: 'fdr_n' })).body.total).toBe(0);
  });

  it('follows the hierarchy: a zone lists its four feeders, the system its zones or its whole subtree', async () => {
    expect(keysOf((await list({ parent: 'zone-north' })).body)).toEqual(['fdr-n1', 'fdr-n2', 'fdr-n3', 'fdr-n4']);
    expect(keysOf((await list({ parent: String(ids.get('zone-north')) })).body)).toEqual(['fdr-n1', 'fdr-n2', 'fdr-n3', 'fdr-n4']);
    expect(keysOf((await list({ parent: 'sys' })).body)).toEqual(['zone-central', 'zone-north', 'zone-south']);
    const subtree = await list({ parent: 'sys', descendants: 'true', limit: 200 });
    expect(subtree.body.total).toBe(15);
    expect((await list({ parent: 'sys', descendants: 'true', level: 'feeder' })).body.total).toBe(12);
  });

  it('answers 400 for an unknown parent and for bad query values', async () => {
    const unknown = await list({ parent: 'zone-west' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.errors).toEqual([{ pointer: '/query/parent', detail: 'No series "zone-west"' }]);
    expect((await list({ level: 'station' })).status).toBe(400);
    expect((await list({ limit: 1000 })).status).toBe(400);
    expect((await list({ descendants: 'yes' })).status).toBe(400);
  });
});

describe('one series', () => {
  it('gives the parent chain, station, children and reading counts by quality flag', async () => {
    const response = await api()
      .get(`/api/series/${ids.get('fdr-n2')}`)
      .set('Authorization', `Bearer ${tokens.read}`);
    expect(response.status).toBe(200);
    expect(response.body.parentChain.map((p: { key: string }) => p.key)).toEqual(['sys', 'zone-north']);
    expect(response.body.temperatureSeries).toMatchObject({ key: 'wx-upland', kind: 'temperature', unit: 'degF' });
    expect(response.body.childrenCount).toBe(0);
    // Two years of hours (730 days × 24) less the demo's three-hour communication gap.
    expect(response.body.readings).toMatchObject({
      count: 730 * 24 - 3,
      firstAt: '2024-12-01T00:00:00.000Z',
      latestAt: '2026-11-30T23:00:00.000Z',
    });
    const stored = await server.pool.query<{ n: number }>(
      'select count(*)::int as n from observations where series_id = $1 and quality & 4 <> 0',
      [ids.get('fdr-n2')],
    );
    expect(response.body.readings.byQuality.spike).toBe(stored.rows[0]!.n);
    expect(Object.keys(response.body.readings.byQuality)).toContain('estimated');

    const zone = await api()
      .get(`/api/series/${ids.get('zone-north')}`)
      .set('Cookie', viewer.cookie);
    expect(zone.body).toMatchObject({ childrenCount: 4, activeChildrenCount: 4, parentChain: [{ key: 'sys', level: 'system' }] });
    const station = await api()
      .get(`/api/series/${ids.get('wx-upland')}`)
      .set('Cookie', viewer.cookie);
    expect(station.body).toMatchObject({ level: null, linkedLoadCount: 5, temperatureSeries: null });
  });

  it('is found by key as well as by id, and answers 404 for neither', async () => {
    const byKey = await api().get('/api/series/fdr-n2').set('Cookie', viewer.cookie);
    expect(byKey.body).toMatchObject({ id: ids.get('fdr-n2'), key: 'fdr-n2' });
    const response = await api().get('/api/series/999999').set('Cookie', viewer.cookie);
    expect(response.status).toBe(404);
    expect(response.body.detail).toBe('No series "999999".');
  });
});

describe('editing', () => {
  it('creates a series as a steward, audited', async () => {
    const response = await asSteward(api().post('/api/series')).send(newFeeder());
    expect(response.status).toBe(201);
    expect(response.body).toMatchObject({
      key: 'fdr-n5',
      parentKey: 'zone-north',
      timestampsMark: 'start',
      parentChain: [{ key: 'sys' }, { key: 'zone-north' }],
      readings: { count: 0, latestAt: null },
    });
    ids.set('fdr-n5', response.body.id);
    const audit = await server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, 'series.created'), eq(auditLog.targetId, String(response.body.id))));
    expect(audit).toHaveLength(1);
    expect(audit[0]!.detail).toMatchObject({ key: 'fdr-n5', unit: 'kW', intervalMinutes: 15 });
  });

  it('refuses viewers and tokens', async () => {
    const byViewer = await api()
      .post('/api/series')
      .set('Cookie', viewer.cookie)
      .set('X-CSRF-Token', viewer.csrf)
      .send(newFeeder({ key: 'fdr-v' }));
    expect(byViewer.status).toBe(403);
    const byToken = await api()
      .post('/api/series')
      .set('Authorization', `Bearer ${tokens.readWrite}`)
      .send(newFeeder({ key: 'fdr-t' }));
    expect(byToken.status).toBe(403);
  });

  it.each([
    [
      'a parent of the same level',
      () => newFeeder({ key: 'fdr-x1', parentId: ids.get('fdr-n1') }),
      400,
      '/parentId',
      'fdr-n1 is a feeder; the parent of a feeder must be of a higher level (system > zone > substation > feeder)',
    ],
    [
      'a zone under a zone',
      () => newFeeder({ key: 'zone-x', level: 'zone', parentId: ids.get('zone-south') }),
      400,
      '/parentId',
      'zone-south is a zone; the parent of a zone must be of a higher level (system > zone > substation > feeder)',
    ],
    ['an unknown zone', () => newFeeder({ key: 'fdr-x2', parentId: 424242 }), 400, '/parentId', 'No series with id 424242'],
    [
      'a station as parent',
      () => newFeeder({ key: 'fdr-x3', parentId: ids.get('wx-lowland') }),
      400,
      '/parentId',
      'wx-lowland is a temperature series and cannot be a parent in the network hierarchy',
    ],
    ['a duplicate key', () => newFeeder({ key: 'fdr-n1' }), 409, '/key', 'Already used by N1 Harrow Pike East'],
    [
      'a temperature unit for load',
      () => newFeeder({ key: 'fdr-x4', unit: 'degF' }),
      400,
      '/unit',
      'A load series is stored in W, kW, MW, not degF',
    ],
    [
      'a load unit for temperature',
      () => ({ key: 'wx-x', name: 'Ridge', kind: 'temperature', unit: 'MW', intervalMinutes: 60, timeZone: 'UTC' }),
      400,
      '/unit',
      'A temperature series is stored in degC, degF, not MW',
    ],
    [
      'a level on a temperature series',
      () => ({ key: 'wx-y', name: 'Ridge', kind: 'temperature', level: 'zone', unit: 'degC', intervalMinutes: 60, timeZone: 'UTC' }),
      400,
      '/level',
      'A temperature series has no level: it sits outside the network hierarchy',
    ],
    [
      'a load series without level',
      () => newFeeder({ key: 'fdr-x5', level: null }),
      400,
      '/level',
      'A load series needs a level: system, zone, substation or feeder',
    ],
    [
      'a load series as weather station',
      () => newFeeder({ key: 'fdr-x6', temperatureSeriesId: ids.get('sys') }),
      400,
      '/temperatureSeriesId',
      'sys is a load series; link a temperature series',
    ],
    [
      'an unknown time zone',
      () => newFeeder({ key: 'fdr-x7', timeZone: 'America/Tallowmere' }),
      400,
      '/timeZone',
      'Not an IANA time zone name; use a name such as America/Chicago or Europe/Berlin',
    ],
    [
      'an odd interval',
      () => newFeeder({ key: 'fdr-x8', intervalMinutes: 20 }),
      400,
      '/intervalMinutes',
      'Interval must be 5, 15, 30, 60 or 1440 (daily) minutes',
    ],
    [
      'a key with capitals',
      () => newFeeder({ key: 'Fdr-N9' }),
      400,
      '/key',
      'Use lower-case letters a–z, digits 0–9 and hyphens, starting with a letter (e.g. fdr-n1)',
    ],
  ])('refuses %s with a message on the field', async (_case, body, status, pointer, detail) => {
    const response = await asSteward(api().post('/api/series')).send(body());
    expect(response.status).toBe(status);
    expect(response.body.errors).toContainEqual({ pointer, detail });
  });

  it('stores nothing for a refused series', async () => {
    const rows = await server.db.select({ key: series.key }).from(series);
    expect(rows.map((r) => r.key).filter((k) => /-x\d?$|-x\d|fdr-v|fdr-t|wx-[xy]/.test(k))).toEqual([]);
  });

  it('changes a series and audits the fields that changed', async () => {
    const id = ids.get('fdr-n5')!;
    const response = await asSteward(api().patch(`/api/series/${id}`)).send({ name: 'N5 Kestrel Ridge', timestampsMark: 'end' });
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ name: 'N5 Kestrel Ridge', timestampsMark: 'end', unit: 'kW' });
    const [audit] = await server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, 'series.updated'), eq(auditLog.targetId, String(id))));
    expect(audit!.detail).toEqual({
      key: 'fdr-n5',
      changes: { name: { from: 'N5 Kestrel Ridge Road', to: 'N5 Kestrel Ridge' }, timestampsMark: { from: 'start', to: 'end' } },
    });
  });

  it('checks an edit against the rules as the series would be after it', async () => {
    const unitOfKind = await asSteward(api().patch(`/api/series/${ids.get('fdr-n5')}`)).send({ unit: 'degC' });
    expect(unitOfKind.status).toBe(400);
    expect(unitOfKind.body.errors).toContainEqual({ pointer: '/unit', detail: 'A load series is stored in W, kW, MW, not degC' });
    const kind = await asSteward(api().patch(`/api/series/${ids.get('fdr-n5')}`)).send({ kind: 'temperature' });
    expect(kind.status).toBe(400);
    expect(kind.body.errors).toEqual([{ pointer: '/kind', detail: 'The kind cannot change' }]);
    const zoneDown = await asSteward(api().patch(`/api/series/${ids.get('zone-north')}`)).send({ level: 'feeder' });
    expect(zoneDown.status).toBe(400);
    expect(zoneDown.body.errors).toContainEqual({
      pointer: '/level',
      detail: 'This series has feeder children; a feeder must sit above them. Move the children first',
    });
    const empty = await asSteward(api().patch(`/api/series/${ids.get('fdr-n5')}`)).send({});
    expect(empty.status).toBe(400);
  });

  it('keeps the unit and interval of a series that holds readings', async () => {
    const unit = await asSteward(api().patch(`/api/series/${ids.get('fdr-n1')}`)).send({ unit: 'MW' });
    expect(unit.status).toBe(409);
    expect(unit.body.detail).toBe(
      'fdr-n1 already holds readings in kW every 60 minutes; the unit cannot change. Create a new series for the new unit.',
    );
    const interval = await asSteward(api().patch(`/api/series/${ids.get('fdr-n1')}`)).send({ intervalMinutes: 15 });
    expect(interval.status).toBe(409);
    // A series without readings may still change both.
    const free = await asSteward(api().patch(`/api/series/${ids.get('fdr-n5')}`)).send({ unit: 'MW', intervalMinutes: 60 });
    expect(free.status).toBe(200);
  });

  it('refuses a key already taken when renaming', async () => {
    const response = await asSteward(api().patch(`/api/series/${ids.get('fdr-n5')}`)).send({ key: 'fdr-n4' });
    expect(response.status).toBe(409);
    expect(response.body.errors).toEqual([{ pointer: '/key', detail: 'Already used by N4 Bramblecote Quarry' }]);
  });
});

describe('archiving', () => {
  it('hides an archived series by default, lists it on request, and restores it', async () => {
    const id = ids.get('fdr-n5')!;
    const archived = await asSteward(api().post(`/api/series/${id}/archive`)).send();
    expect(archived.status).toBe(200);
    expect(archived.body.archivedAt).not.toBeNull();
    expect(keysOf((await list({ parent: 'zone-north' })).body)).toEqual(['fdr-n1', 'fdr-n2', 'fdr-n3', 'fdr-n4']);
    expect(keysOf((await list({ parent: 'zone-north', archived: 'true' })).body)).toEqual(['fdr-n5']);
    expect((await list({ parent: 'zone-north', archived: 'all' })).body.total).toBe(5);
    expect((await asSteward(api().post(`/api/series/${id}/archive`)).send()).status).toBe(409);

    const restored = await asSteward(api().post(`/api/series/${id}/restore`)).send();
    expect(restored.status).toBe(200);
    expect(restored.body.archivedAt).toBeNull();
    // The most recently changed series comes first when sorted by update time.
    expect(keysOf((await list({ sort: 'updated', order: 'desc', limit: 1 })).body)).toEqual(['fdr-n5']);
    const actions = await server.db
      .select({ action: auditLog.action })
      .from(auditLog)
      .where(eq(auditLog.targetId, String(id)));
    expect(actions.map((a) => a.action)).toEqual(expect.arrayContaining(['series.archived', 'series.restored']));
  });

  it('refuses to archive a series with live children, or to link to an archived one', async () => {
    const zone = await asSteward(api().post(`/api/series/${ids.get('zone-north')}/archive`)).send();
    expect(zone.status).toBe(409);
    expect(zone.body.detail).toBe('zone-north has 5 live children; archive or move them first.');

    const id = ids.get('fdr-n5')!;
    await asSteward(api().post(`/api/series/${id}/archive`)).send();
    const child = await asSteward(api().post('/api/series')).send(newFeeder({ key: 'fdr-n5a', level: 'feeder', parentId: id }));
    expect(child.status).toBe(400);
    expect(child.body.errors).toContainEqual({
      pointer: '/parentId',
      detail: 'fdr-n5 is archived; restore it first or choose a live parent',
    });
  });
});
