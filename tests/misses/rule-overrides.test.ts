/**
 * A planner's overrides of miss rules through the API: the rules in force for a series and a group and
 * where each comes from; adding, changing and removing an override (audited, one per kind and place);
 * refusals in sentences that change nothing; viewers read but never change; and detection following the
 * override, then the default again once the override is removed.
 */
import type { MissRulesInForce } from '@loadwright/contracts';
import { auditLog, missRules } from '@loadwright/db';
import { detectMisses, ensureDefaultRules } from '@loadwright/misses';
import { and, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { actuals, approvedForecast, eventsOf, loadSeries } from './support';

let server: TestServer;
let planner: SignedIn;
let viewer: SignedIn;
let feederId: number;

const as = (who: SignedIn) => ({
  get: (path: string) => request(server.url).get(path).set('Cookie', who.cookie),
  post: (path: string, body: object) => request(server.url).post(path).set('Cookie', who.cookie).set('X-CSRF-Token', who.csrf).send(body),
  patch: (path: string, body: object) => request(server.url).patch(path).set('Cookie', who.cookie).set('X-CSRF-Token', who.csrf).send(body),
  delete: (path: string) => request(server.url).delete(path).set('Cookie', who.cookie).set('X-CSRF-Token', who.csrf),
});

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  await ensureDefaultRules(server.db);
  const people = await createPeople(server.db, '-rules');
  planner = await signIn(server.url, people.planner.email);
  viewer = await signIn(server.url, people.viewer.email);
  feederId = await loadSeries(server.db, 'rules-feeder');
});
afterAll(() => server.close());

const kindOf = (view: MissRulesInForce, kind: string) => view.kinds.find((entry) => entry.kind === kind)!;

describe('rules in force', () => {
  it('shows the defaults for a series with no overrides, kind by kind', async () => {
    const response = await as(viewer).get(`/api/miss-rules/in-force?series=${feederId}`);
    expect(response.status).toBe(200);
    const view = response.body as MissRulesInForce;
    expect(view.kinds).toHaveLength(7);
    const band = kindOf(view, 'outside_band');
    expect(band).toMatchObject({ source: 'default', override: null, kindName: 'Outside the band' });
    // The default from rule-kinds.ts: 3 hours outside the 95 % band.
    expect(band.inForce).toMatchObject({ scope: 'all', hours: 3, bandLevel: 95, reads: ['hours', 'bandLevel'] });
  });

  it('asks for one series or one group, in a sentence', async () => {
    const response = await as(viewer).get('/api/miss-rules/in-force');
    expect(response.status).toBe(400);
    expect(response.body.detail).toBe(
      'Ask for the rules of one series (series=<id>) or of one group (level=<level>), not both or neither.',
    );
  });
});

describe('overrides', () => {
  it('a planner overrides a kind for a group; the group and its series follow it', async () => {
    const created = await as(planner).post('/api/miss-rules', {
      kind: 'outside_band',
      scope: 'level',
      scopeLevel: 'feeder',
      hours: 2,
      bandLevel: 80,
      severity: 'low',
      recipients: ['role:planner'],
    });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Outside the band for every feeder', hours: 2, bandLevel: 80 });
    const group = (await as(planner).get('/api/miss-rules/in-force?level=feeder')).body as MissRulesInForce;
    expect(kindOf(group, 'outside_band')).toMatchObject({ source: 'level', override: { id: created.body.id } });
    const one = (await as(planner).get(`/api/miss-rules/in-force?series=${feederId}`)).body as MissRulesInForce;
    // The series inherits the group's override but has none of its own.
    expect(kindOf(one, 'outside_band')).toMatchObject({ source: 'level', override: null, inForce: { id: created.body.id } });
    const [audit] = await server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, 'miss_rule.added'), eq(auditLog.targetId, String(created.body.id))));
    expect(audit).toBeDefined();
  });

  it('refuses a second override of the same kind for the same place, and changes nothing', async () => {
    const before = await server.db.select().from(missRules);
    const again = await as(planner).post('/api/miss-rules', { kind: 'outside_band', scope: 'level', scopeLevel: 'feeder', bandLevel: 90 });
    expect(again.status).toBe(409);
    expect(again.body.detail).toMatch(
      /^Outside the band already has an override for every feeder \(rule \d+\); change that one instead\.$/,
    );
    expect(await server.db.select().from(missRules)).toEqual(before);
  });

  it('refuses parameters the kind does not read, naming them', async () => {
    const refused = await as(planner).post('/api/miss-rules', {
      kind: 'outside_band',
      scope: 'series',
      scopeSeriesId: feederId,
      threshold: 12,
      floorKw: 40,
    });
    expect(refused.status).toBe(400);
    expect(refused.body.detail).toBe('Outside the band takes no threshold and no load floor; leave those fields empty.');
    expect(refused.body.errors.map((e: { pointer: string }) => e.pointer)).toEqual(['/threshold', '/floorKw']);
  });

  it('refuses a recipient that is neither an address nor a role', async () => {
    const refused = await as(planner).post('/api/miss-rules', {
      kind: 'error_over_threshold',
      scope: 'series',
      scopeSeriesId: feederId,
      threshold: 12,
      recipients: ['the control room'],
    });
    expect(refused.status).toBe(400);
    expect(JSON.stringify(refused.body.errors)).toContain(
      'Each recipient is an e-mail address (name@example.org) or a role written role:planner',
    );
  });

  it('a viewer reads the rules but cannot add, change or remove one', async () => {
    const [rule] = await server.db.select().from(missRules).where(eq(missRules.scope, 'level'));
    expect((await as(viewer).post('/api/miss-rules', { kind: 'creeping_bias', scope: 'level', scopeLevel: 'zone' })).status).toBe(403);
    expect((await as(viewer).patch(`/api/miss-rules/${rule!.id}`, { hours: 5 })).status).toBe(403);
    expect((await as(viewer).delete(`/api/miss-rules/${rule!.id}`)).status).toBe(403);
  });

  it('a planner cannot remove a default rule', async () => {
    const [fallback] = await server.db.select().from(missRules).where(eq(missRules.scope, 'all'));
    const refused = await as(planner).delete(`/api/miss-rules/${fallback!.id}`);
    expect(refused.status).toBe(409);
    expect(refused.body.detail).toBe('A default rule cannot be removed; an admin switches it off in Settings instead.');
  });
});

describe('detection follows the override, and the default once it is removed', () => {
  it('judges a series by its own override, then by the group override after removal', async () => {
    // 2026-10-31 00:00 CDT is 05:00Z; the 95 % band is [90, 110] around a flat 100 (tests/misses/support.ts).
    const seriesId = await loadSeries(server.db, 'rules-detect');
    await approvedForecast(server.db, seriesId, '2026-10-31T05:00:00Z', 48);
    // A series override: one hour outside the 95 % band is a miss.
    const created = await as(planner).post('/api/miss-rules', {
      kind: 'outside_band',
      scope: 'series',
      scopeSeriesId: seriesId,
      hours: 1,
      bandLevel: 95,
      severity: 'high',
    });
    expect(created.status).toBe(201);
    const changed = await as(planner).patch(`/api/miss-rules/${created.body.id}`, { severity: 'medium' });
    expect(changed.status).toBe(200);
    expect(changed.body.severity).toBe('medium');
    // One hour at 115 (outside [90, 110]) at 05:00Z.
    await actuals(server.db, seriesId, '2026-10-31T05:00:00Z', [115, 100]);
    await detectMisses(server.db, seriesId, new Date('2026-10-31T07:00:00Z'));
    const [event] = await eventsOf(server.db, seriesId);
    expect(event).toMatchObject({ ruleId: created.body.id, severity: 'medium' });

    const removed = await as(planner).delete(`/api/miss-rules/${created.body.id}`);
    expect(removed.status).toBe(200);
    expect(removed.body.message).toBe('Override removed: Outside the band follows the group override or the default again.');
    const view = (await as(planner).get(`/api/miss-rules/in-force?series=${seriesId}`)).body as MissRulesInForce;
    expect(kindOf(view, 'outside_band')).toMatchObject({ source: 'level', override: null, inForce: { scopeLevel: 'feeder', hours: 2 } });
    // The group override (2 hours outside the 80 % band, ±6.5) now judges: 108 and 107 are outside [93.5, 106.5].
    await actuals(server.db, seriesId, '2026-10-31T07:00:00Z', [108, 107]);
    await detectMisses(server.db, seriesId, new Date('2026-10-31T09:00:00Z'));
    // Other default kinds (e.g. creeping bias) may also fire on these hours; only outside-the-band misses count here.
    const groupRuleId = kindOf(view, 'outside_band').inForce!.id;
    const events = (await eventsOf(server.db, seriesId)).filter((e) => e.ruleId === created.body.id || e.ruleId === groupRuleId);
    expect(events).toHaveLength(2);
    expect(events[1]).toMatchObject({ ruleId: groupRuleId, severity: 'low' });
    // The first miss keeps its (removed) rule.
    expect(events[0]!.ruleId).toBe(created.body.id);
  });
});
