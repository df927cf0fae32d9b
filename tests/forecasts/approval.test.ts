/**
 * Approval: supersedes the previous approved version, leaves approved versions immutable, settles
 * races with exactly one approved version per series, and bulk-approves a group all or none after a
 * preview of what changes.
 */
import { approvalPreviewSchema, approvalResultSchema } from '@loadwright/contracts';
import { auditLog, forecastAdjustments, forecastVersions } from '@loadwright/db';
import { and, eq, inArray } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { asBrowser, startForecastServer, type ForecastTestContext } from './support/forecast-server';
import { writeDraftVersion } from './support/draft-versions';

let t: ForecastTestContext;
let planner: ReturnType<typeof asBrowser>;
let admin: ReturnType<typeof asBrowser>;

const origin = new Date('2026-12-03T06:00:00Z');

beforeAll(async () => {
  t = await startForecastServer();
  planner = asBrowser(t.server.url, t.planner);
  admin = asBrowser(t.server.url, t.admin);
});
afterAll(() => t.server.close());

/** State of each version of a series, by id. */
async function states(seriesId: number): Promise<Map<number, string>> {
  const rows = await t.server.db
    .select({ id: forecastVersions.id, state: forecastVersions.state })
    .from(forecastVersions)
    .where(eq(forecastVersions.seriesId, seriesId));
  return new Map(rows.map((row) => [row.id, row.state]));
}
const approvedCount = async (seriesId: number) => [...(await states(seriesId)).values()].filter((state) => state === 'approved').length;

describe('approving one draft', () => {
  it('approves, then supersedes the previous approved version with the next approval', async () => {
    const seriesId = t.seriesId('fdr-n1');
    const first = await writeDraftVersion(t.server.db, { seriesId, origin });
    const firstApproval = await planner.post(`/api/forecast-versions/${first}/approve`);
    expect(firstApproval.status).toBe(200);
    expect(approvalResultSchema.parse(firstApproval.body).approved).toEqual([{ versionId: first, seriesId, supersededVersionId: null }]);

    const second = await writeDraftVersion(t.server.db, { seriesId, origin: new Date(origin.getTime() + 86_400_000) });
    const secondApproval = await planner.post(`/api/forecast-versions/${second}/approve`);
    expect(secondApproval.status).toBe(200);
    expect(secondApproval.body.approved).toEqual([{ versionId: second, seriesId, supersededVersionId: first }]);

    const [old] = await t.server.db.select().from(forecastVersions).where(eq(forecastVersions.id, first));
    const [current] = await t.server.db.select().from(forecastVersions).where(eq(forecastVersions.id, second));
    expect(old).toMatchObject({ state: 'superseded', approvedById: t.planner.userId });
    expect(old!.supersededAt!.toISOString()).toBe(secondApproval.body.approvedAt);
    expect(current).toMatchObject({ state: 'approved', approvedById: t.planner.userId, supersededAt: null });
    expect(current!.approvedAt!.toISOString()).toBe(secondApproval.body.approvedAt);

    const audit = await t.server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, 'forecast.approved'), eq(auditLog.targetId, String(second))));
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ actorUserId: t.planner.userId, targetType: 'forecast_version' });
    expect(audit[0]!.detail).toMatchObject({ seriesId, supersededVersionId: first });
  });

  it('keeps approved versions immutable: no second approval, no adjustment added or removed, no point changed', async () => {
    const seriesId = t.seriesId('fdr-n2');
    const draft = await writeDraftVersion(t.server.db, { seriesId, origin });
    const adjustment = await planner.post(`/api/forecast-versions/${draft}/adjustments`, {
      from: origin.toISOString(),
      to: new Date(origin.getTime() + 3 * 3_600_000).toISOString(),
      kind: 'shift',
      amount: -40,
      reason: 'Planned feeder outage',
    });
    expect(adjustment.status).toBe(201);
    expect((await planner.post(`/api/forecast-versions/${draft}/approve`)).status).toBe(200);

    const again = await planner.post(`/api/forecast-versions/${draft}/approve`);
    expect(again.status).toBe(409);
    expect(again.body.detail).toContain('approved already');
    expect(
      (
        await planner.post(`/api/forecast-versions/${draft}/adjustments`, {
          from: origin.toISOString(),
          to: new Date(origin.getTime() + 3_600_000).toISOString(),
          kind: 'scale',
          amount: 2,
          reason: 'After the fact',
        })
      ).status,
    ).toBe(409);
    expect((await planner.delete(`/api/forecast-versions/${draft}/adjustments/${adjustment.body.id}`)).status).toBe(409);
    expect(await t.server.db.select().from(forecastAdjustments).where(eq(forecastAdjustments.versionId, draft))).toHaveLength(1);
    // The database itself refuses, whoever writes.
    await expect(t.server.pool.query('update forecast_points set mean = mean + 1 where version_id = $1', [draft])).rejects.toMatchObject({
      code: '55000',
    });
    await expect(
      t.server.pool.query("update forecast_versions set origin = origin + interval '1 hour' where id = $1", [draft]),
    ).rejects.toMatchObject({ code: '55000' });
  });

  it('refuses a draft that a newer refit replaced, and unknown versions', async () => {
    const seriesId = t.seriesId('fdr-n3');
    const replaced = await writeDraftVersion(t.server.db, { seriesId, origin });
    await writeDraftVersion(t.server.db, { seriesId, origin: new Date(origin.getTime() + 3_600_000) });
    const response = await planner.post(`/api/forecast-versions/${replaced}/approve`);
    expect(response.status).toBe(409);
    expect(response.body.detail).toContain('superseded');
    expect(await approvedCount(seriesId)).toBe(0);
    expect((await planner.post('/api/forecast-versions/999999/approve')).status).toBe(404);
  });

  it('is for planners and admins: a viewer and a steward get 403, and so does a read token', async () => {
    const seriesId = t.seriesId('fdr-n4');
    const draft = await writeDraftVersion(t.server.db, { seriesId, origin });
    expect((await asBrowser(t.server.url, t.viewer).post(`/api/forecast-versions/${draft}/approve`)).status).toBe(403);
    expect((await asBrowser(t.server.url, t.steward).post(`/api/forecast-versions/${draft}/approve`)).status).toBe(403);
    const byToken = await request(t.server.url)
      .post(`/api/forecast-versions/${draft}/approve`)
      .set('Authorization', `Bearer ${t.readToken}`);
    expect(byToken.status).toBe(403);
    expect((await states(seriesId)).get(draft)).toBe('draft');
    expect((await admin.post(`/api/forecast-versions/${draft}/approve`)).status).toBe(200);
  });
});

describe('races', () => {
  it('two approvals of one draft at once: one succeeds, the other is told it is approved already', async () => {
    const seriesId = t.seriesId('fdr-c1');
    for (let round = 0; round < 5; round++) {
      const draft = await writeDraftVersion(t.server.db, { seriesId, origin: new Date(origin.getTime() + round * 3_600_000) });
      const responses = await Promise.all([
        planner.post(`/api/forecast-versions/${draft}/approve`),
        admin.post(`/api/forecast-versions/${draft}/approve`),
      ]);
      expect(responses.map((r) => r.status).sort()).toEqual([200, 409]);
      expect(await approvedCount(seriesId)).toBe(1);
      expect((await states(seriesId)).get(draft)).toBe('approved');
    }
  });

  it('approvals of two different drafts of one series at once (one replaced by a refit meanwhile): exactly one approved', async () => {
    const seriesId = t.seriesId('fdr-c2');
    for (let round = 0; round < 5; round++) {
      const older = await writeDraftVersion(t.server.db, { seriesId, origin: new Date(origin.getTime() + round * 3_600_000) });
      // A planner opened the older draft; the refit writes a newer one while a colleague approves that.
      const [oldApproval, [newer, newApproval]] = await Promise.all([
        planner.post(`/api/forecast-versions/${older}/approve`),
        writeDraftVersion(t.server.db, { seriesId, origin: new Date(origin.getTime() + (round + 10) * 3_600_000) }).then(
          async (id) => [id, await admin.post(`/api/forecast-versions/${id}/approve`)] as const,
        ),
      ]);
      const byState = await states(seriesId);
      expect([...byState.values()].filter((state) => state === 'approved')).toHaveLength(1);
      expect([...byState.values()].filter((state) => state === 'draft')).toHaveLength(0);
      // Whichever order the database saw, the newer draft ends approved, and the older one was either
      // approved first (then superseded) or refused because the refit had replaced it.
      expect(byState.get(newer)).toBe('approved');
      expect(newApproval.status).toBe(200);
      expect([200, 409]).toContain(oldApproval.status);
      expect(byState.get(older)).toBe('superseded');
    }
  });

  it('a single approval racing a bulk approval of the same draft and another series: one wins whole', async () => {
    const a = t.seriesId('fdr-c3');
    const b = t.seriesId('fdr-c4');
    for (let round = 0; round < 4; round++) {
      const draftA = await writeDraftVersion(t.server.db, { seriesId: a, origin: new Date(origin.getTime() + round * 3_600_000) });
      const draftB = await writeDraftVersion(t.server.db, { seriesId: b, origin: new Date(origin.getTime() + round * 3_600_000) });
      const [single, bulk] = await Promise.all([
        planner.post(`/api/forecast-versions/${draftA}/approve`),
        admin.post('/api/forecast-approvals', { versionIds: [draftB, draftA] }),
      ]);
      expect([single.status, bulk.status].sort()).toEqual([200, 409]);
      expect(await approvedCount(a)).toBe(1);
      expect((await states(a)).get(draftA)).toBe('approved');
      // All or none: when the bulk approval lost, draftB is still a draft.
      expect((await states(b)).get(draftB)).toBe(bulk.status === 200 ? 'approved' : 'draft');
      if (bulk.status === 409)
        expect(bulk.body.errors).toEqual([{ pointer: '/versionIds/1', detail: `Forecast version ${draftA} is approved already.` }]);
    }
  });
});

describe('bulk approval of a group', () => {
  const week = 168;
  let drafts: Map<string, number>;
  let previouslyApproved: Map<string, number>;

  beforeAll(async () => {
    // Zone south and its four feeders: two have an approved version, three have a draft.
    previouslyApproved = new Map();
    for (const key of ['zone-south', 'fdr-s1']) {
      const id = await writeDraftVersion(t.server.db, { seriesId: t.seriesId(key), origin, mean: (i) => 100 + (i === 20 ? 50 : 0) });
      expect((await planner.post(`/api/forecast-versions/${id}/approve`)).status).toBe(200);
      previouslyApproved.set(key, id);
    }
    drafts = new Map();
    for (const key of ['zone-south', 'fdr-s1', 'fdr-s2']) {
      // A day later, 10 % higher, and peaking at hour 40 of its own horizon.
      const id = await writeDraftVersion(t.server.db, {
        seriesId: t.seriesId(key),
        origin: new Date(origin.getTime() + 86_400_000),
        hours: week,
        mean: (i) => 110 + (i === 40 ? 90 : 0),
      });
      drafts.set(key, id);
    }
  });

  it('previews what changes, series by series, for a parent and its descendants', async () => {
    const response = await planner.post('/api/forecast-approvals/preview', { parentId: t.seriesId('zone-south') });
    expect(response.status).toBe(200);
    const preview = approvalPreviewSchema.parse(response.body);
    expect(preview.items.map((item) => item.series.key).sort()).toEqual(['fdr-s1', 'fdr-s2', 'fdr-s3', 'fdr-s4', 'zone-south']);
    expect(preview.versionIds.sort((x, y) => x - y)).toEqual([...drafts.values()].sort((x, y) => x - y));
    expect(preview.withoutDraft).toBe(2);

    const zone = preview.items.find((item) => item.series.key === 'zone-south')!;
    expect(zone.draft).toMatchObject({ versionId: drafts.get('zone-south'), adjustmentCount: 0 });
    expect(zone.approved).toMatchObject({ versionId: previouslyApproved.get('zone-south') });
    // Draft peak 200 at hour 40 of its horizon (origin + 1 day); approved peak 150 at hour 20.
    expect(zone.draft!.peak).toMatchObject({ value: 200, ts: new Date(origin.getTime() + 86_400_000 + 40 * 3_600_000).toISOString() });
    expect(zone.approved!.peak).toMatchObject({ value: 150, ts: new Date(origin.getTime() + 20 * 3_600_000).toISOString() });
    expect(zone.peakDifference).toBe(50);
    expect(zone.peakDifferencePercent).toBeCloseTo(100 / 3, 10);
    // Common window: 144 hours, approved 100 flat there (its peak is outside), draft 110 plus the 90 at hour 40.
    expect(zone.energy).toMatchObject({ intervals: 144, approved: 144 * 100, draft: 144 * 110 + 90 });
    expect(zone.energy!.differencePercent).toBeCloseTo(((144 * 110 + 90) / (144 * 100) - 1) * 100, 10);

    const newOnly = preview.items.find((item) => item.series.key === 'fdr-s2')!;
    expect(newOnly).toMatchObject({ approved: null, peakDifference: null, energy: null });
    expect(preview.items.find((item) => item.series.key === 'fdr-s3')).toMatchObject({ draft: null, approved: null });
  });

  it('previews listed series too, and says which ids are unknown', async () => {
    const listed = await planner.post('/api/forecast-approvals/preview', { seriesIds: [t.seriesId('fdr-s2')] });
    expect(listed.status).toBe(200);
    expect(listed.body.versionIds).toEqual([drafts.get('fdr-s2')]);
    expect((await planner.post('/api/forecast-approvals/preview', { seriesIds: [999999] })).status).toBe(404);
    expect((await planner.post('/api/forecast-approvals/preview', {})).status).toBe(400);
    expect(
      (await asBrowser(t.server.url, t.viewer).post('/api/forecast-approvals/preview', { parentId: t.seriesId('zone-south') })).status,
    ).toBe(403);
  });

  it('refuses the whole batch when one version is stale, approving nothing', async () => {
    const staleId = previouslyApproved.get('fdr-s1')!; // approved already
    const ids = [...drafts.values()];
    const response = await planner.post('/api/forecast-approvals', { versionIds: [...ids, staleId] });
    expect(response.status).toBe(409);
    expect(response.body.errors).toEqual([
      { pointer: `/versionIds/${ids.length}`, detail: `Forecast version ${staleId} is approved already.` },
    ]);
    const rows = await t.server.db
      .select({ state: forecastVersions.state })
      .from(forecastVersions)
      .where(inArray(forecastVersions.id, ids));
    expect(rows.every((row) => row.state === 'draft')).toBe(true);
  });

  it('approves the previewed drafts in one transaction, superseding the approved ones', async () => {
    const preview = approvalPreviewSchema.parse(
      (await planner.post('/api/forecast-approvals/preview', { parentId: t.seriesId('zone-south') })).body,
    );
    const response = await planner.post('/api/forecast-approvals', { versionIds: preview.versionIds });
    expect(response.status).toBe(200);
    const result = approvalResultSchema.parse(response.body);
    expect(result.approved).toHaveLength(3);
    const bySeries = new Map(result.approved.map((entry) => [entry.seriesId, entry]));
    expect(bySeries.get(t.seriesId('zone-south'))!.supersededVersionId).toBe(previouslyApproved.get('zone-south'));
    expect(bySeries.get(t.seriesId('fdr-s2'))!.supersededVersionId).toBeNull();
    const rows = await t.server.db
      .select()
      .from(forecastVersions)
      .where(inArray(forecastVersions.id, [...drafts.values(), ...previouslyApproved.values()]));
    for (const row of rows) {
      const expected = [...drafts.values()].includes(row.id) ? 'approved' : 'superseded';
      expect(row.state).toBe(expected);
    }
    // One approval instant for the whole batch.
    expect(new Set(rows.filter((row) => row.state === 'approved').map((row) => row.approvedAt!.toISOString()))).toEqual(
      new Set([result.approvedAt]),
    );

    const again = await planner.post('/api/forecast-approvals', { versionIds: preview.versionIds });
    expect(again.status).toBe(409);
    expect(again.body.errors).toHaveLength(3);
    expect((await planner.post('/api/forecast-approvals', { versionIds: [1, 1] })).status).toBe(400);
  });
});
