import argon2 from 'argon2';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../libs/db/src/client';
import { digestOfDemo } from '../../fixtures/demo/digest';
import { generateDemo, type DemoData } from '../../fixtures/demo/generate';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo, type SeedDemoResult } from '../../libs/db/src/seed/seed-demo';
import { createTestDatabase } from '../support/database';

const expected = generateDemo();
const expectedReadings = expected.series.reduce((sum, series) => sum + series.values.filter((value) => !Number.isNaN(value)).length, 0);

describe('seedDemo on a migrated, empty database', () => {
  let url: string;
  let client: pg.Client;
  let first: SeedDemoResult;

  beforeAll(async () => {
    url = await createTestDatabase();
    first = await seedDemo(url);
    client = new pg.Client({ connectionString: url });
    await client.connect();
  });

  afterAll(async () => {
    await client?.end();
  });

  const count = async (table: string) => Number((await client.query(`select count(*) as n from ${table}`)).rows[0].n);

  it('seeds the organisation once, with the co-op time zone and holiday country', async () => {
    expect(first.seeded).toBe(true);
    const { rows } = await client.query('select name, time_zone, holiday_country from organisation');
    expect(rows).toEqual([{ name: demoScenario.organisation.name, time_zone: 'America/Chicago', holiday_country: 'US' }]);
  });

  it('creates one account per role whose argon2id hash verifies the demo password', async () => {
    const { rows } = await client.query<{ email: string; role: string; password_hash: string }>(
      'select email, role, password_hash from users order by role',
    );
    expect(rows.map((row) => row.role)).toEqual(['admin', 'steward', 'planner', 'viewer']);
    expect(rows.map((row) => row.email).sort()).toEqual(demoScenario.accounts.map((account) => account.email).sort());
    for (const row of rows) {
      expect(row.password_hash.startsWith('$argon2id$v=19$m=19456,t=2,p=1$')).toBe(true);
      expect(await argon2.verify(row.password_hash, demoScenario.demoPassword)).toBe(true);
      expect(await argon2.verify(row.password_hash, 'not the demo password')).toBe(false);
    }
  });

  it('creates the series catalogue with its hierarchy, units and temperature links', async () => {
    const { rows } = await client.query<{
      key: string;
      level: string | null;
      unit: string;
      parent: string | null;
      station: string | null;
      peer_group: string | null;
    }>(`
      select s.key, s.level, s.unit, p.key as parent, t.key as station, s.peer_group
      from series s left join series p on p.id = s.parent_id left join series t on t.id = s.temperature_series_id`);
    const byKey = new Map(rows.map((row) => [row.key, row]));
    expect(rows).toHaveLength(18);
    expect(byKey.get('sys')).toMatchObject({ level: 'system', unit: 'MW', parent: null });
    expect(byKey.get('zone-north')).toMatchObject({ level: 'zone', unit: 'MW', parent: 'sys', station: 'wx-upland' });
    expect(byKey.get('fdr-s3')).toMatchObject({
      level: 'feeder',
      unit: 'kW',
      parent: 'zone-south',
      station: 'wx-lowland',
      peer_group: 'rural-residential',
    });
    expect(byKey.get('wx-upland')).toMatchObject({ level: null, unit: 'degF', parent: null, station: null });
    for (const feeder of demoScenario.feeders) expect(byKey.get(feeder.key)?.parent).toBe(feeder.zoneKey);
  });

  it('gives every load series a default model spec and none to the stations', async () => {
    const { rows } = await client.query(
      'select s.kind, count(*)::int as n from model_specs m join series s on s.id = m.series_id group by s.kind',
    );
    expect(rows).toEqual([{ kind: 'load', n: 16 }]);
  });

  it('stores the public holidays of the demo years from the holiday package', async () => {
    const { rows } = await client.query<{ day: string; name: string }>(
      `select to_char(day, 'YYYY-MM-DD') as day, name from holidays where source = 'package' order by day`,
    );
    expect(rows.length).toBeGreaterThanOrEqual(4 * 11);
    expect(rows).toContainEqual({ day: '2025-11-27', name: 'Thanksgiving Day' });
    expect(rows).toContainEqual({ day: '2026-07-03', name: 'Independence Day (substitute day)' });
    expect(rows.some((row) => row.day.startsWith('2027-'))).toBe(true);
  });

  it('writes one row per recorded reading and leaves gaps as absent rows', async () => {
    expect(first.observations).toBe(expectedReadings);
    expect(await count('observations')).toBe(expectedReadings);
    const { rows } = await client.query(`
      select count(*)::int as n from observations o join series s on s.id = o.series_id
      where s.key = 'fdr-c3' and o.ts = '2025-11-02T07:00:00Z'`);
    expect(rows[0].n).toBe(0);
  });

  it('stores exactly the generator output for the same seed, defects included', async () => {
    const stored = await readBack(client, expected);
    expect(digestOfDemo(stored)).toBe(digestOfDemo(expected));
    const { rows } = await client.query(`
      select o.value from observations o join series s on s.id = o.series_id
      where s.key = 'fdr-n3' and o.ts = '2025-10-07T16:00:00Z'`);
    expect(rows[0].value).toBeLessThan(0);
  });

  it('does nothing the second time', async () => {
    const tables = ['organisation', 'users', 'series', 'holidays', 'model_specs', 'observations'];
    const countAll = async () => {
      const counts: number[] = [];
      for (const table of tables) counts.push(await count(table));
      return counts;
    };
    const before = await countAll();
    const again = await seedDemo(url);
    expect(again).toMatchObject({ seeded: false, observations: 0 });
    expect(await countAll()).toEqual(before);
  });
});

describe('seedDemo under contention and failure', () => {
  it('seeds exactly once when two starts race on the same empty database', async () => {
    const url = await createTestDatabase();
    const results = await Promise.all([seedDemo(url), seedDemo(url)]);
    expect(results.map((result) => result.seeded).sort()).toEqual([false, true]);
    const client = new pg.Client({ connectionString: url });
    await client.connect();
    const { rows } = await client.query(
      'select (select count(*) from organisation)::int as orgs, (select count(*) from observations)::int as readings',
    );
    await client.end();
    expect(rows[0]).toEqual({ orgs: 1, readings: expectedReadings });
  });

  it('leaves nothing behind when a step fails part-way (given an open database rather than a URL)', async () => {
    const url = await createTestDatabase();
    // Two accounts whose e-mails differ only in case break the unique index after the organisation row is in.
    const clash = {
      ...demoScenario,
      accounts: [demoScenario.accounts[0]!, { ...demoScenario.accounts[1]!, email: demoScenario.accounts[0]!.email.toUpperCase() }],
    };
    const handle = createDb(url, { max: 1 });
    try {
      await expect(seedDemo(handle.db, { scenario: clash })).rejects.toMatchObject({ cause: { constraint: 'users_email_lower_key' } });
    } finally {
      await handle.close();
    }
    const client = new pg.Client({ connectionString: url });
    await client.connect();
    const { rows } = await client.query(
      'select (select count(*) from organisation)::int as orgs, (select count(*) from users)::int as people, (select count(*) from series)::int as series',
    );
    await client.end();
    expect(rows[0]).toEqual({ orgs: 0, people: 0, series: 0 });
  });
});

/** Rebuilds DemoData from the stored readings, NaN where no row exists, on the generator's grid. */
async function readBack(client: pg.Client, like: DemoData): Promise<DemoData> {
  const { rows } = await client.query<{ key: string; ms: number; value: number }>(`
    select s.key, (extract(epoch from o.ts) * 1000)::float8 as ms, o.value
    from observations o join series s on s.id = o.series_id`);
  const series = like.series.map((entry) => ({ key: entry.key, values: new Float64Array(like.length).fill(Number.NaN) }));
  const byKey = new Map(series.map((entry) => [entry.key, entry.values]));
  for (const row of rows) {
    const index = (row.ms - like.startMs) / like.intervalMs;
    byKey.get(row.key)![index] = row.value;
  }
  return { ...like, series };
}
