import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { is } from 'drizzle-orm';
import { getTableConfig, PgTable } from 'drizzle-orm/pg-core';
import { describe, expect, it } from 'vitest';
import { migrationsFolder } from './migrate';
import * as schema from './schema';

const tables = (Object.values(schema) as unknown[])
  .filter((value): value is PgTable => is(value, PgTable))
  .map((table) => getTableConfig(table));

/** The snapshot drizzle-kit wrote with the newest migration: what the migrations build. */
function latestSnapshot(): { tables: Record<string, SnapshotTable> } {
  const journal = JSON.parse(readFileSync(resolve(migrationsFolder, 'meta/_journal.json'), 'utf8')) as {
    entries: { idx: number }[];
  };
  const last = journal.entries.at(-1)!.idx.toString().padStart(4, '0');
  return JSON.parse(readFileSync(resolve(migrationsFolder, `meta/${last}_snapshot.json`), 'utf8'));
}

interface SnapshotTable {
  name: string;
  columns: Record<string, { name: string; notNull: boolean }>;
  indexes: Record<string, unknown>;
  checkConstraints: Record<string, unknown>;
}

const snakeCase = /^[a-z][a-z0-9_]*$/;

describe('schema conventions', () => {
  it.each(tables.map((t) => [t.name, t] as const))('%s uses snake_case names and has a primary key', (_, table) => {
    expect(table.name).toMatch(snakeCase);
    for (const column of table.columns) expect(column.name).toMatch(snakeCase);
    const hasPrimaryKey = table.primaryKeys.length > 0 || table.columns.some((column) => column.primary);
    expect(hasPrimaryKey).toBe(true);
  });

  it.each(tables.map((t) => [t.name, t] as const))('%s names its indexes and checks after itself', (_, table) => {
    for (const index of table.indexes) expect(index.config.name).toMatch(new RegExp(`^${table.name}_`));
    for (const check of table.checks) expect(check.name).toMatch(new RegExp(`^${table.name}_`));
  });
});

describe('generated migrations', () => {
  const snapshot = latestSnapshot();

  it('cover exactly the tables the schema declares (run `npx drizzle-kit generate` after a schema change)', () => {
    const inSnapshot = Object.values(snapshot.tables)
      .map((t) => t.name)
      .sort();
    expect(inSnapshot).toEqual(tables.map((t) => t.name).sort());
  });

  it.each(tables.map((t) => [t.name, t] as const))('match the columns, indexes and checks of %s', (name, table) => {
    const stored = snapshot.tables[`public.${name}`]!;
    expect(Object.values(stored.columns).map((c) => [c.name, c.notNull])).toEqual(table.columns.map((c) => [c.name, c.notNull]));
    expect(Object.keys(stored.indexes).sort()).toEqual(table.indexes.map((i) => i.config.name).sort());
    expect(Object.keys(stored.checkConstraints).sort()).toEqual(table.checks.map((c) => c.name).sort());
  });
});

describe('qualityFlag', () => {
  it('gives each flag its own bit inside a signed smallint', () => {
    const bits = Object.values(schema.qualityFlag);
    expect(new Set(bits).size).toBe(bits.length);
    for (const bit of bits) {
      expect(Number.isInteger(Math.log2(bit))).toBe(true);
      expect(bit).toBeLessThan(2 ** 15);
    }
  });
});
