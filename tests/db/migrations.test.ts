/**
 * The migrations in drizzle/ against a real PostgreSQL: they build the whole schema on an empty
 * database, a second run changes nothing, concurrent runs are safe, and the constraints the
 * product relies on hold.
 */
import { is, sql } from 'drizzle-orm';
import { getTableConfig, PgTable } from 'drizzle-orm/pg-core';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import * as schema from '@loadwright/db';
import { createDb, migrate, type DbHandle } from '@loadwright/db';
import { createDatabase, dropDatabase } from '../../scripts/postgres';
import { createTestDatabase } from '../support/database';

const adminUrl = () => inject('adminDatabaseUrl');

/** Every table the schema declares, by SQL name. */
const declaredTables: string[] = (Object.values(schema) as unknown[])
  .filter((value): value is PgTable => is(value, PgTable))
  .map((table) => getTableConfig(table).name)
  .sort();

/** Columns, constraints and indexes of the public schema, as one comparable text. */
async function schemaFingerprint(client: pg.Client): Promise<string> {
  const { rows } = await client.query<{ line: string }>(`
    select 'column ' || table_name || '.' || column_name || ' ' || data_type || ' ' || is_nullable || ' ' || coalesce(column_default, '') as line
      from information_schema.columns where table_schema = 'public'
    union all
    select 'constraint ' || conrelid::regclass || ' ' || conname || ' ' || pg_get_constraintdef(oid)
      from pg_constraint where connamespace = 'public'::regnamespace
    union all
    select 'index ' || indexname || ' ' || indexdef from pg_indexes where schemaname = 'public'
    order by 1`);
  return rows.map((row) => row.line).join('\n');
}

/** Runs `work` and returns the PostgreSQL error code it failed with (or 'none'). */
async function sqlState(work: () => Promise<unknown>): Promise<string> {
  try {
    await work();
    return 'none';
  } catch (error) {
    const cause = (error as { cause?: { code?: string } }).cause;
    return (error as { code?: string }).code ?? cause?.code ?? 'unknown';
  }
}

describe('migrations on an empty database', () => {
  const name = `${inject('templateDatabase')}_migrations_${process.pid}`;
  let url: string;
  let client: pg.Client;

  beforeAll(async () => {
    await dropDatabase(adminUrl(), name);
    await createDatabase(adminUrl(), name);
    const target = new URL(adminUrl());
    target.pathname = `/${name}`;
    url = target.toString();
    client = new pg.Client({ connectionString: url });
    await client.connect();
  });

  afterAll(async () => {
    await client?.end();
    await dropDatabase(adminUrl(), name);
  });

  it('create every table the schema declares', async () => {
    const before = await client.query(`select count(*)::int as n from information_schema.tables where table_schema = 'public'`);
    expect(before.rows[0].n).toBe(0);

    await migrate(url);

    const { rows } = await client.query<{ table_name: string }>(
      `select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' order by table_name`,
    );
    expect(rows.map((row) => row.table_name)).toEqual(declaredTables);
    expect(declaredTables).toContain('observations');
    expect(declaredTables.length).toBeGreaterThanOrEqual(23);
  });

  it('change nothing when run again, even by two processes at once', async () => {
    const before = await schemaFingerprint(client);
    const applied = await client.query('select count(*)::int as n from drizzle.__drizzle_migrations');

    await Promise.all([migrate(url), migrate(url)]);

    expect(await schemaFingerprint(client)).toBe(before);
    const again = await client.query('select count(*)::int as n from drizzle.__drizzle_migrations');
    expect(again.rows[0].n).toBe(applied.rows[0].n);
  });
});

describe('constraints of the core schema', () => {
  let handle: DbHandle;
  let client: pg.PoolClient;
  let loadSeriesId: number;
  let fitId: number;

  beforeAll(async () => {
    handle = createDb(await createTestDatabase());
    client = await handle.pool.connect();
    const [feeder] = await handle.db
      .insert(schema.series)
      .values({ key: 'FDR-1', name: 'Feeder 1', kind: 'load', level: 'feeder', unit: 'MW', timeZone: 'America/Chicago' })
      .returning();
    loadSeriesId = feeder!.id;
    const [fit] = await handle.db
      .insert(schema.fits)
      .values({
        seriesId: loadSeriesId,
        specSnapshot: { method: 'auto' },
        method: 'yule_walker',
        arOrder: 2,
        parameters: { ar: [0.5, 0.2] },
        dataStart: new Date('2025-01-01T00:00:00Z'),
        dataEnd: new Date('2025-12-31T23:00:00Z'),
        observationCount: 8760,
        dataHash: 'a'.repeat(64),
        durationMs: 12,
      })
      .returning();
    fitId = fit!.id;
  });

  afterAll(async () => {
    client?.release();
    await handle?.close();
  });

  const version = (state: 'draft' | 'approved' | 'superseded') => ({
    seriesId: loadSeriesId,
    fitId,
    state,
    origin: new Date('2026-01-01T00:00:00Z'),
    horizonHours: 168,
    approvedAt: state === 'draft' ? null : new Date(),
    supersededAt: state === 'superseded' ? new Date() : null,
  });

  it('allow one draft and one approved version per series, any number superseded', async () => {
    await handle.db.insert(schema.forecastVersions).values(version('draft'));
    expect(await sqlState(() => handle.db.insert(schema.forecastVersions).values(version('draft')))).toBe('23505');
    await handle.db.insert(schema.forecastVersions).values(version('approved'));
    expect(await sqlState(() => handle.db.insert(schema.forecastVersions).values(version('approved')))).toBe('23505');
    await handle.db.insert(schema.forecastVersions).values([version('superseded'), version('superseded')]);
  });

  it('refuse a second series with the same key', async () => {
    const duplicate = { key: 'FDR-1', name: 'Other', kind: 'load', level: 'feeder', unit: 'kW', timeZone: 'UTC' } as const;
    expect(await sqlState(() => handle.db.insert(schema.series).values(duplicate))).toBe('23505');
  });

  it('keep one reading per series and instant, and let intake skip exact repeats', async () => {
    const ts = new Date('2026-01-05T10:00:00Z');
    await handle.db.insert(schema.observations).values({ seriesId: loadSeriesId, ts, value: 4.2 });
    expect(await sqlState(() => handle.db.insert(schema.observations).values({ seriesId: loadSeriesId, ts, value: 4.3 }))).toBe('23505');
    await handle.db.insert(schema.observations).values({ seriesId: loadSeriesId, ts, value: 4.2 }).onConflictDoNothing();
    const { rows } = await client.query('select value from observations where series_id = $1 and ts = $2', [loadSeriesId, ts]);
    expect(rows).toEqual([{ value: 4.2 }]);
  });

  it('check the series and upload of readings once per statement, as foreign keys would', async () => {
    const ts = new Date('2026-01-06T00:00:00Z');
    const missingSeries = [
      { seriesId: loadSeriesId, ts, value: 1 },
      { seriesId: 999_999, ts, value: 2 },
    ];
    expect(await sqlState(() => handle.db.insert(schema.observations).values(missingSeries))).toBe('23503');
    expect(
      await sqlState(() => handle.db.insert(schema.observations).values({ seriesId: loadSeriesId, ts, value: 1, uploadId: 999_999 })),
    ).toBe('23503');
    const { rows } = await client.query('select count(*)::int as n from observations where ts = $1', [ts]);
    expect(rows[0].n).toBe(0);
  });

  it('refuse to delete an upload that landed readings, and delete a failed one', async () => {
    const [landed] = await handle.db
      .insert(schema.uploads)
      .values({ fileName: 'landed.csv', contentSha256: 'd'.repeat(64), byteSize: 1, status: 'done' })
      .returning();
    const [failed] = await handle.db
      .insert(schema.uploads)
      .values({ fileName: 'failed.csv', contentSha256: 'e'.repeat(64), byteSize: 1, status: 'failed' })
      .returning();
    expect(await sqlState(() => client.query('delete from uploads where id = $1', [landed!.id]))).toBe('23503');
    await client.query('delete from uploads where id = $1', [failed!.id]);
  });

  it('refuse a row with neither a raw reading nor an estimate', async () => {
    const ts = new Date('2026-01-05T11:00:00Z');
    expect(await sqlState(() => handle.db.insert(schema.observations).values({ seriesId: loadSeriesId, ts }))).toBe('23514');
  });

  it('refuse values outside the closed sets', async () => {
    expect(
      await sqlState(() => client.query(`insert into users (email, display_name, role) values ('a@example.test', 'A', 'superuser')`)),
    ).toBe('22P02');
    expect(await sqlState(() => client.query(`update forecast_versions set state = 'pending' where series_id = $1`, [loadSeriesId]))).toBe(
      '22P02',
    );
    expect(
      await sqlState(() =>
        client.query(`insert into series (key, name, kind, level, unit, time_zone, interval_minutes)
                      values ('FDR-7', 'Seven', 'load', 'feeder', 'MW', 'UTC', 7)`),
      ),
    ).toBe('23514');
  });

  it('treat e-mail addresses as equal regardless of case', async () => {
    await handle.db.insert(schema.users).values({ email: 'Planner@Example.test', displayName: 'P', role: 'planner' });
    expect(await sqlState(() => handle.db.insert(schema.users).values({ email: 'planner@example.TEST', displayName: 'Q' }))).toBe('23505');
  });

  it('hold exactly one organisation row', async () => {
    await handle.db.insert(schema.organisation).values({ name: 'Test Cooperative' });
    expect(await sqlState(() => handle.db.insert(schema.organisation).values({ name: 'Second' }))).toBe('23505');
    expect(await sqlState(() => client.query(`insert into organisation (singleton, name) values (false, 'Third')`))).toBe('23514');
  });

  it('make a repeated upload of the same content a conflict unless the first one failed', async () => {
    const upload = { fileName: 'a.csv', contentSha256: 'b'.repeat(64), byteSize: 10 };
    const [first] = await handle.db.insert(schema.uploads).values(upload).returning();
    expect(await sqlState(() => handle.db.insert(schema.uploads).values(upload))).toBe('23505');
    await client.query(`update uploads set status = 'failed' where id = $1`, [first!.id]);
    await handle.db.insert(schema.uploads).values(upload);
  });
});

describe('forecast versions once they leave draft', () => {
  let handle: DbHandle;
  let seriesId: number;
  let fitId: number;

  beforeAll(async () => {
    handle = createDb(await createTestDatabase());
    const [row] = await handle.db
      .insert(schema.series)
      .values({ key: 'SYS', name: 'System', kind: 'load', level: 'system', unit: 'MW', timeZone: 'UTC' })
      .returning();
    seriesId = row!.id;
    const [fit] = await handle.db
      .insert(schema.fits)
      .values({
        seriesId,
        specSnapshot: {},
        method: 'seasonal_naive',
        parameters: {},
        dataStart: new Date('2025-01-01T00:00:00Z'),
        dataEnd: new Date('2025-01-31T23:00:00Z'),
        observationCount: 744,
        dataHash: 'c'.repeat(64),
        durationMs: 1,
      })
      .returning();
    fitId = fit!.id;
  });

  afterAll(async () => {
    await handle?.close();
  });

  /** A draft with three hourly points, as a refit writes it. */
  async function draftWithPoints(origin: Date): Promise<number> {
    const [version] = await handle.db.insert(schema.forecastVersions).values({ seriesId, fitId, origin, horizonHours: 3 }).returning();
    await handle.db.insert(schema.forecastPoints).values(
      [0, 1, 2].map((h) => ({
        versionId: version!.id,
        ts: new Date(origin.getTime() + h * 3_600_000),
        mean: 100 + h,
        stdError: 5,
        lower80: 93.6 + h,
        upper80: 106.4 + h,
        lower95: 90.2 + h,
        upper95: 109.8 + h,
      })),
    );
    return version!.id;
  }

  /** Where-clause selecting one version by id. */
  const byId = (id: number) => sql`${schema.forecastVersions.id} = ${id}`;

  it('let a draft be adjusted and approved, then refuse changes to its numbers', async () => {
    const id = await draftWithPoints(new Date('2026-02-01T00:00:00Z'));
    await handle.db.insert(schema.forecastAdjustments).values({
      versionId: id,
      periodStart: new Date('2026-02-01T00:00:00Z'),
      periodEnd: new Date('2026-02-01T02:00:00Z'),
      kind: 'shift',
      amount: -3,
      reason: 'Plant outage announced',
    });
    await handle.db.update(schema.forecastVersions).set({ state: 'approved', approvedAt: new Date() }).where(byId(id));

    expect(await sqlState(() => handle.pool.query('update forecast_points set mean = mean + 1 where version_id = $1', [id]))).toBe('55000');
    expect(await sqlState(() => handle.pool.query('delete from forecast_points where version_id = $1', [id]))).toBe('55000');
    expect(
      await sqlState(() =>
        handle.db.insert(schema.forecastAdjustments).values({
          versionId: id,
          periodStart: new Date('2026-02-01T00:00:00Z'),
          periodEnd: new Date('2026-02-01T01:00:00Z'),
          kind: 'scale',
          amount: 1.1,
          reason: 'Late change',
        }),
      ),
    ).toBe('55000');
    expect(await sqlState(() => handle.pool.query(`update forecast_versions set horizon_hours = 5 where id = $1`, [id]))).toBe('55000');
    expect(await sqlState(() => handle.pool.query(`update forecast_versions set state = 'draft' where id = $1`, [id]))).toBe('55000');
  });

  it('let an approved version be superseded once, and nothing after', async () => {
    const { rows } = await handle.pool.query(`select id from forecast_versions where state = 'approved'`);
    const id = rows[0].id as number;
    await handle.pool.query(`update forecast_versions set state = 'superseded', superseded_at = now() where id = $1`, [id]);
    expect(await sqlState(() => handle.pool.query(`update forecast_versions set state = 'approved' where id = $1`, [id]))).toBe('55000');
    expect(
      await sqlState(() => handle.pool.query(`update forecast_versions set superseded_at = now() - interval '1 day' where id = $1`, [id])),
    ).toBe('55000');
  });

  it('still let a deleted series take its versions, points, adjustments and readings with it', async () => {
    await draftWithPoints(new Date('2026-02-02T00:00:00Z'));
    await handle.db.insert(schema.observations).values({ seriesId, ts: new Date('2026-01-31T23:00:00Z'), value: 7 });
    await handle.db
      .insert(schema.observationRevisions)
      .values({ seriesId, ts: new Date('2026-01-31T23:00:00Z'), value: 6, quality: 0, revision: 1 });
    await handle.pool.query('delete from series where id = $1', [seriesId]);
    const { rows } = await handle.pool
      .query(`select (select count(*) from forecast_versions)::int as v, (select count(*) from forecast_points)::int as p,
      (select count(*) from observations)::int as o, (select count(*) from observation_revisions)::int as r`);
    expect(rows[0]).toEqual({ v: 0, p: 0, o: 0, r: 0 });
  });
});

describe('relational queries over the schema', () => {
  let handle: DbHandle;

  beforeAll(async () => {
    handle = createDb(await createTestDatabase());
  });

  afterAll(async () => {
    await handle?.close();
  });

  it('walk the hierarchy and the linked temperature station', async () => {
    const [station] = await handle.db
      .insert(schema.series)
      .values({ key: 'WX-1', name: 'Station 1', kind: 'temperature', unit: 'degC', timeZone: 'UTC' })
      .returning();
    const [system] = await handle.db
      .insert(schema.series)
      .values({ key: 'SYS', name: 'System', kind: 'load', level: 'system', unit: 'MW', timeZone: 'UTC', temperatureSeriesId: station!.id })
      .returning();
    await handle.db.insert(schema.series).values([
      { key: 'Z-1', name: 'Zone 1', kind: 'load', level: 'zone', unit: 'MW', timeZone: 'UTC', parentId: system!.id },
      { key: 'Z-2', name: 'Zone 2', kind: 'load', level: 'zone', unit: 'MW', timeZone: 'UTC', parentId: system!.id },
    ]);

    const found = await handle.db.query.series.findFirst({
      where: (s, { eq }) => eq(s.key, 'SYS'),
      with: { children: { columns: { key: true } }, temperatureSeries: { columns: { key: true } }, parent: true },
    });

    expect(found?.children.map((c) => c.key).sort()).toEqual(['Z-1', 'Z-2']);
    expect(found?.temperatureSeries?.key).toBe('WX-1');
    expect(found?.parent).toBeNull();
  });

  it('refuse a temperature station placed in the load hierarchy', async () => {
    const misplaced = { key: 'WX-2', name: 'Station 2', kind: 'temperature', level: 'feeder', unit: 'degC', timeZone: 'UTC' } as const;
    expect(await sqlState(() => handle.db.insert(schema.series).values(misplaced))).toBe('23514');
    const wrongUnit = { key: 'F-9', name: 'Feeder 9', kind: 'load', level: 'feeder', unit: 'degF', timeZone: 'UTC' } as const;
    expect(await sqlState(() => handle.db.insert(schema.series).values(wrongUnit))).toBe('23514');
  });
});
