/**
 * Coherence across the hierarchy and reconciliation as a planner, on the seeded demo co-op (zone-north in MW,
 * its feeders n1–n4 in kW, 28 days of actuals before 2026-12-01 with 3.1 % losses between them).
 */
import { hierarchyCoherenceSchema, reconciliationResultSchema } from '@loadwright/contracts';
import { forecastPoints, forecastVersions, observations } from '@loadwright/db';
import { and, asc, eq, gte, inArray, lt } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeDraftVersion } from './support/draft-versions';
import { asBrowser, startForecastServer, type ForecastTestContext } from './support/forecast-server';

let t: ForecastTestContext;
let planner: ReturnType<typeof asBrowser>;
let viewer: ReturnType<typeof asBrowser>;

/** The hour after the demo's last actual (2026-11-30T23:00Z). */
const origin = new Date('2026-12-01T00:00:00Z');
const hourMs = 3_600_000;
const feeders = ['fdr-n1', 'fdr-n2', 'fdr-n3', 'fdr-n4'];

/** Drafts whose feeders add to 10 MW every hour (1, 2, 3, 4 MW written in kW) and a zone at 11 MW. */
async function writeZoneNorthDrafts(): Promise<void> {
  for (const [k, key] of feeders.entries()) {
    await writeDraftVersion(t.server.db, { seriesId: t.seriesId(key), origin, mean: () => 1000 * (k + 1), stdError: () => 50 * (k + 1) });
  }
  await writeDraftVersion(t.server.db, { seriesId: t.seriesId('zone-north'), origin, mean: () => 11, stdError: () => 0.4 });
}

beforeAll(async () => {
  t = await startForecastServer();
  planner = asBrowser(t.server.url, t.planner);
  viewer = asBrowser(t.server.url, t.viewer);
});
afterAll(() => t.server.close());

describe('coherence of a parent with its children', () => {
  it('shows the zone against the sum of its feeders hour by hour, in the zone’s unit', async () => {
    await writeZoneNorthDrafts();
    const response = await viewer.get(`/api/series/${t.seriesId('zone-north')}/coherence`);
    expect(response.status).toBe(200);
    const coherence = hierarchyCoherenceSchema.parse(response.body);
    expect(coherence.children.map((c) => c.series.key).sort()).toEqual(feeders);
    expect(coherence.hours).toHaveLength(168);
    // 1000 + 2000 + 3000 + 4000 kW = 10 MW; gap 11 − 10 = 1 MW = 100/11 = 9.0909 % of the zone, every hour.
    for (const hour of coherence.hours) {
      expect(hour.childrenSum).toBeCloseTo(10, 10);
      expect(hour.gap).toBeCloseTo(1, 10);
      expect(hour.remainder).toBeNull();
    }
    expect(coherence.summary.meanAbsGapPercent).toBeCloseTo(100 / 11, 8);
    expect(coherence.summary.maxAbsGapPercent).toBeCloseTo(100 / 11, 8);
    expect(coherence.summary.coherent).toBe(false);
    expect(coherence.reconciliation).toBeNull();
  });

  it('says which versions are missing when comparing approved versions that do not exist', async () => {
    const response = await viewer.get(`/api/series/${t.seriesId('zone-north')}/coherence?state=approved`);
    expect(response.status).toBe(200);
    const coherence = hierarchyCoherenceSchema.parse(response.body);
    expect(coherence.hours).toEqual([]);
    expect(coherence.summary.coherent).toBe(false);
    expect(coherence.notes.join(' ')).toMatch(/zone-north\) has no approved version/);
    expect(coherence.notes.join(' ')).toMatch(/fdr-n1\) has no approved version: the sum leaves it out/);
  });

  it('refuses a feeder (nothing under it) and an unknown series with clear problems', async () => {
    const feeder = await viewer.get(`/api/series/${t.seriesId('fdr-n1')}/coherence`);
    expect(feeder.status).toBe(409);
    expect(feeder.body.detail).toMatch(/has no series under it/);
    expect((await viewer.get('/api/series/999999/coherence')).status).toBe(404);
  });
});

describe('reconciling a hierarchy as planner', () => {
  it('refuses a viewer, and a hierarchy whose series lack drafts (listing each), writing nothing', async () => {
    expect((await viewer.post(`/api/series/${t.seriesId('zone-south')}/reconciliations`, { method: 'bottom-up' })).status).toBe(403);
    const before = await t.server.db.select({ id: forecastVersions.id }).from(forecastVersions);
    const response = await planner.post(`/api/series/${t.seriesId('zone-south')}/reconciliations`, { method: 'bottom-up' });
    expect(response.status).toBe(409);
    expect(response.body.errors).toHaveLength(5); // zone-south and fdr-s1..s4
    expect(response.body.errors[0].detail).toMatch(/has no draft/);
    expect(await t.server.db.select({ id: forecastVersions.id }).from(forecastVersions)).toHaveLength(before.length);
    const unknown = await planner.post(`/api/series/${t.seriesId('zone-north')}/reconciliations`, { method: 'sideways' });
    expect(unknown.status).toBe(400);
  });

  it('bottom-up keeps the feeders and makes the zone their sum plus the historical unmetered remainder, checked from the actuals', async () => {
    await writeZoneNorthDrafts();
    const response = await planner.post(`/api/series/${t.seriesId('zone-north')}/reconciliations`, { method: 'bottom-up' });
    expect(response.status).toBe(201);
    const result = reconciliationResultSchema.parse(response.body);
    expect(result.versions).toHaveLength(5);
    expect(result.horizonHours).toBe(168);
    const versionOf = new Map(result.versions.map((v) => [v.key, v.versionId]));
    const pointsOf = (versionId: number) =>
      t.server.db.select().from(forecastPoints).where(eq(forecastPoints.versionId, versionId)).orderBy(asc(forecastPoints.ts));
    // Bottom-up: G = [0 | I], so each feeder keeps its own base forecast exactly.
    for (const [k, key] of feeders.entries()) {
      const points = await pointsOf(versionOf.get(key)!);
      expect(points.every((p) => Math.abs(p.mean - 1000 * (k + 1)) < 1e-9)).toBe(true);
    }
    // The remainder's base forecast is its hour-of-week mean over the 28 days before the origin: computed here
    // straight from the stored actuals, remainder_t = zone_t − Σ feeders_t / 1000 (kW → MW), 4 weeks per slot.
    const from = new Date(origin.getTime() - 28 * 24 * hourMs);
    const ids = ['zone-north', ...feeders].map((key) => t.seriesId(key));
    const rows = await t.server.db
      .select({ seriesId: observations.seriesId, ts: observations.ts, value: observations.value, estimated: observations.estimated })
      .from(observations)
      .where(and(inArray(observations.seriesId, ids), gte(observations.ts, from), lt(observations.ts, origin)));
    const byHour = new Map<number, Map<number, number>>();
    for (const row of rows) {
      const value = row.estimated ?? row.value;
      if (value === null) continue;
      const hour = byHour.get(row.ts.getTime()) ?? new Map<number, number>();
      hour.set(row.seriesId, value);
      byHour.set(row.ts.getTime(), hour);
    }
    const slotSum = new Float64Array(168);
    const slotCount = new Float64Array(168);
    for (const [ms, hour] of byHour) {
      if (hour.size !== ids.length) continue;
      const remainder = hour.get(ids[0]!)! - feeders.reduce((acc, key) => acc + hour.get(t.seriesId(key))! / 1000, 0);
      const slot = ((((ms - origin.getTime()) / hourMs) % 168) + 168) % 168;
      slotSum[slot] += remainder;
      slotCount[slot] += 1;
    }
    const zone = await pointsOf(versionOf.get('zone-north')!);
    expect(zone).toHaveLength(168);
    zone.forEach((p, h) => expect(p.mean).toBeCloseTo(10 + slotSum[h]! / slotCount[h]!, 9));
    // The demo's zone-north losses are 3.1 % of its feeders: the remainder's share of the zone is near 3 %.
    expect(result.remainders).toHaveLength(1);
    expect(result.remainders[0]!.meanSharePercent).toBeGreaterThan(2);
    expect(result.remainders[0]!.meanSharePercent).toBeLessThan(4);

    const coherence = hierarchyCoherenceSchema.parse((await viewer.get(`/api/series/${t.seriesId('zone-north')}/coherence`)).body);
    expect(coherence.reconciliation).toMatchObject({ id: result.id, method: 'bottom-up', wholeSet: true });
    expect(coherence.summary.coherent).toBe(true);
    expect(coherence.summary.maxAbsGapPercent!).toBeLessThan(1e-9);
  });

  it('min-trace writes a coherent set with ordered bands and supersedes the drafts it started from', async () => {
    await writeZoneNorthDrafts();
    const old = await t.server.db
      .select({ id: forecastVersions.id })
      .from(forecastVersions)
      .where(and(eq(forecastVersions.seriesId, t.seriesId('zone-north')), eq(forecastVersions.state, 'draft')));
    const response = await planner.post(`/api/series/${t.seriesId('zone-north')}/reconciliations`, { method: 'min-trace' });
    expect(response.status).toBe(201);
    const result = reconciliationResultSchema.parse(response.body);
    expect(result.shrinkage).toBeGreaterThanOrEqual(0);
    expect(result.shrinkage).toBeLessThanOrEqual(1);
    const [replaced] = await t.server.db.select().from(forecastVersions).where(eq(forecastVersions.id, old[0]!.id));
    expect(replaced!.state).toBe('superseded');
    const coherence = hierarchyCoherenceSchema.parse((await viewer.get(`/api/series/${t.seriesId('zone-north')}/coherence`)).body);
    expect(coherence.summary.coherent).toBe(true);
    // MinT moves the zone between its own base (11 MW) and the feeders' sum with losses (about 10.3 MW).
    const zoneHours = coherence.hours.map((h) => h.parent);
    expect(Math.min(...zoneHours)).toBeGreaterThan(9.5);
    expect(Math.max(...zoneHours)).toBeLessThan(11.5);
    const points = await t.server.db
      .select()
      .from(forecastPoints)
      .where(
        inArray(
          forecastPoints.versionId,
          result.versions.map((v) => v.versionId),
        ),
      );
    for (const p of points) {
      expect(p.lower95).toBeLessThanOrEqual(p.lower80);
      expect(p.lower80).toBeLessThanOrEqual(p.mean);
      expect(p.mean).toBeLessThanOrEqual(p.upper80);
      expect(p.upper80).toBeLessThanOrEqual(p.upper95);
    }
  });

  it('approves a reconciled set only whole: one draft alone is refused, the group approves one coherent set', async () => {
    const zoneId = t.seriesId('zone-north');
    const preview = await planner.post('/api/forecast-approvals/preview', { parentId: zoneId });
    expect(preview.status).toBe(200);
    const draftOfN1 = preview.body.items.find((item: { series: { key: string } }) => item.series.key === 'fdr-n1').draft.versionId;
    const alone = await planner.post(`/api/forecast-versions/${draftOfN1}/approve`);
    expect(alone.status).toBe(409);
    expect(alone.body.detail).toMatch(/reconciled across zone-north with 4 others.*Approve the group zone-north/);

    const group = await planner.post('/api/forecast-approvals', { versionIds: preview.body.versionIds });
    expect(group.status).toBe(200);
    expect(group.body.approved).toHaveLength(5);
    const approved = hierarchyCoherenceSchema.parse((await viewer.get(`/api/series/${zoneId}/coherence?state=approved`)).body);
    expect(approved.summary.coherent).toBe(true);
    expect(approved.reconciliation?.method).toBe('min-trace');
    expect(approved.hours).toHaveLength(168);
  });
});
