/** The import core on a real database: inserts, idempotent repeats, revisions, estimates and findings. */
import { createDb, series, uploads, type Database } from '@loadwright/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importReadings } from '@loadwright/intake';
import { createTestDatabase } from '../support/database';

let handle: ReturnType<typeof createDb>;
let db: Database;
let seriesId: number;
const hour = 3_600_000;
const start = Date.UTC(2026, 0, 5);

/** A smooth daily load shape, kW. */
const load = (h: number) => Math.round((500 + 120 * Math.sin((2 * Math.PI * h) / 24) + 7 * Math.cos(h)) * 10) / 10;

beforeAll(async () => {
  handle = createDb(await createTestDatabase(), { max: 2 });
  db = handle.db;
  const [row] = await db
    .insert(series)
    .values({
      key: 'fdr-test',
      name: 'Test feeder',
      kind: 'load',
      level: 'feeder',
      unit: 'kW',
      intervalMinutes: 60,
      timeZone: 'America/Chicago',
    })
    .returning({ id: series.id });
  seriesId = row!.id;
});
afterAll(() => handle.close());

const newUpload = async (name: string) =>
  (await db.insert(uploads).values({ fileName: name, contentSha256: name, byteSize: 1, source: 'api' }).returning({ id: uploads.id }))[0]!
    .id;
const count = async (table: string) => Number((await handle.pool.query(`select count(*) as n from ${table}`)).rows[0].n);

describe('importReadings', () => {
  it('stores new readings, fills a short gap and flags a spike with an estimate', async () => {
    const uploadId = await newUpload('first');
    const readings = Array.from({ length: 72 }, (_, h) => ({
      ts: new Date(start + h * hour),
      value: h === 30 ? load(h) * 5 : load(h),
    })).filter((_, h) => h < 40 || h > 41);
    const result = await db.transaction((tx) =>
      importReadings(tx, { seriesId, readings, uploadId, intervalMinutes: 60, kind: 'load', unit: 'kW' }),
    );
    expect(result).toMatchObject({ inserted: 72, unchanged: 0, revised: 0, rejected: 0 });
    expect(result.findings.countsByRule()).toEqual({ spike: 1, gap: 1, estimated: 3 });
    const gapRows = await handle.pool.query(`select value, estimated, quality from observations where series_id = $1 and ts = $2`, [
      seriesId,
      new Date(start + 40 * hour),
    ]);
    // Linear between hours 39 and 42: a third of the way.
    expect(gapRows.rows[0]).toEqual({ value: null, estimated: Math.round((load(39) + (load(42) - load(39)) / 3) * 1e6) / 1e6, quality: 3 });
    const spike = await handle.pool.query(`select value, estimated, quality from observations where series_id = $1 and ts = $2`, [
      seriesId,
      new Date(start + 30 * hour),
    ]);
    expect(spike.rows[0]).toEqual({ value: load(30) * 5, estimated: (load(29) + load(31)) / 2, quality: 1 | 4 });
    expect(await count('upload_findings')).toBe(5);
  });

  it('adds nothing when the same readings come again', async () => {
    const readings = Array.from({ length: 72 }, (_, h) => ({
      ts: new Date(start + h * hour),
      value: h === 30 ? load(h) * 5 : load(h),
    })).filter((_, h) => h < 40 || h > 41);
    const before = await count('observations');
    const result = await db.transaction((tx) =>
      importReadings(tx, { seriesId, readings, uploadId: null, intervalMinutes: 60, kind: 'load' }),
    );
    expect(result).toMatchObject({ inserted: 0, unchanged: 72, revised: 0 });
    expect(await count('observations')).toBe(before);
    expect(await count('observation_revisions')).toBe(0);
  });

  it('keeps the first revision when a corrected reading arrives, and fills a stored gap with the real reading', async () => {
    const uploadId = await newUpload('correction');
    const readings = [
      { ts: new Date(start + 30 * hour), value: load(30) },
      { ts: new Date(start + 40 * hour), value: 612.5 },
    ];
    const result = await db.transaction((tx) => importReadings(tx, { seriesId, readings, uploadId, intervalMinutes: 60, kind: 'load' }));
    expect(result).toMatchObject({ inserted: 0, unchanged: 0, revised: 2 });
    const current = await handle.pool.query(`select value, revision, upload_id from observations where series_id = $1 and ts = $2`, [
      seriesId,
      new Date(start + 30 * hour),
    ]);
    expect(current.rows[0]).toEqual({ value: load(30), revision: 2, upload_id: uploadId });
    const old = await handle.pool.query(
      `select value, revision, superseded_by_upload_id from observation_revisions where series_id = $1 order by ts`,
      [seriesId],
    );
    expect(old.rows).toEqual([
      { value: load(30) * 5, revision: 1, superseded_by_upload_id: uploadId },
      { value: null, revision: 1, superseded_by_upload_id: uploadId },
    ]);
  });

  it('drops repeated, off-grid and future instants with findings', async () => {
    const uploadId = await newUpload('odd');
    const base = start + 100 * hour;
    const readings = [
      { ts: new Date(base), value: 500 },
      { ts: new Date(base), value: 500 },
      { ts: new Date(base + hour), value: 510 },
      { ts: new Date(base + hour), value: 999 },
      { ts: new Date(base + 2 * hour + 7 * 60_000), value: 520 },
      { ts: new Date(Date.UTC(2030, 0, 1)), value: 530 },
    ];
    const result = await db.transaction((tx) =>
      importReadings(tx, { seriesId, readings, uploadId, intervalMinutes: 60, kind: 'load', now: new Date(Date.UTC(2026, 11, 1)) }),
    );
    expect(result).toMatchObject({ inserted: 2, rejected: 4 });
    expect(result.findings.countsByRule()).toEqual({ duplicate_equal: 1, duplicate_conflict: 1, off_grid: 1, future: 1 });
    const kept = await handle.pool.query(`select value, quality from observations where series_id = $1 and ts = $2`, [
      seriesId,
      new Date(base + hour),
    ]);
    expect(kept.rows[0]).toEqual({ value: 510, quality: 64 });
  });
});
