/**
 * The migrations in drizzle/ against a real PostgreSQL: they build the whole schema on an empty
 * database, a second run changes nothing, concurrent runs are safe, and the constraints the
 * product relies on hold.
 */
import { is } from 'drizzle-orm';
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
    expect(
      await sqlState(() => handle.db.insert(schema.observations).values({ seriesId: loadSeriesId, ts, value: 4.3 })),
    ).toBe('23505');
    await handle.db.insert(schema.observations).values({ seriesId: loadSeriesId, ts, value: 4.2 }).onConflictDoNothing();
    const { rows } = await client.query('select value from observations where series_id = $1 and ts = $2', [loadSeriesId, ts]);
    expect(rows).toEqual([{ value: 4.2 }]);
  });

  it('refuse a row with neither a raw reading nor an estimate', async () => {
    const ts = new Date('2026-01-05T11:00:00Z');
    expect(await sqlState(() => handle.db.insert(schema.observations).values({ seriesId: loadSeriesId, ts }))).toBe('23514');
  });

  it('refuse values outside the closed sets', async () => {
    expect(
      await sqlState(() => client.query(`insert into users (email, display_name, role) values ('a@example.test', 'A', 'superuser')`)),
    ).toBe('22P02');
    expect(
      await sqlState(() => client.query(`update forecast_versions set state = 'pending' where series_id = $1`, [loadSeriesId])),
    ).toBe('22P02');
    expect(
      await sqlState(() =>
        client.query(`insert into series (key, name, kind, level, unit, time_zone, interval_minutes)
                      values ('FDR-7', 'Seven', 'load', 'feeder', 'MW', 'UTC', 7)`),
      ),
    ).toBe('23514');
  });

  it('treat e-mail addresses as equal regardless of case', async () => {
    await handle.db.insert(schema.users).values({ email: 'Planner@Example.test', displayName: 'P', role: 'planner' });
    expect(
      await sqlState(() => handle.db.insert(schema.users).values({ email: 'planner@example.TEST', displayName: 'Q' })),
    ).toBe('23505');
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
