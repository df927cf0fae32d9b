/**
 * One end-to-end import for the intake benchmark, in a process of its own so its memory is measured
 * alone: writes a long CSV file of `--rows` readings over 12 hourly load series, then runs the
 * import job's own code path on it (stream, parse, convert, validate, estimate, one-transaction
 * write) against a fresh database, sampling the resident set size every 20 ms. Prints one JSON line.
 *
 * With `--mode reference` it instead writes the same readings with the seed's plain batched insert
 * (no parsing, no validation, no merge): the database's own pace at this moment. With `--mode
 * reference-unindexed` it does the same after dropping the observations table's one index (its
 * primary key) and its statement-level reference checks: the difference is their upkeep.
 *
 * Usage: node --import tsx --expose-gc bench/intake/import-one-file.ts --rows 1000000 [--mode reference|reference-unindexed]
 */
import { rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import { createDb, series, uploads } from '../../libs/db/src';
import { migrate } from '../../libs/db/src/migrate';
import { createDatabase, dropDatabase, ensurePostgres } from '../../scripts/postgres';
import { importUpload } from '@loadwright/intake';
import { insertObservations } from '../../libs/db/src/seed/insert-observations';
import { writeLoadFile } from './load-file';

const { values: args } = parseArgs({
  options: { rows: { type: 'string', default: '1000000' }, mode: { type: 'string', default: 'import' } },
});
const rows = Number(args.rows);
const seriesCount = 12;
const hourMs = 3_600_000;
const start = Date.UTC(2015, 0, 1);

/** The reference: the same readings through the seed's batched insert, in one transaction. */
async function referenceInsert(db: ReturnType<typeof createDb>['db']) {
  const hours = Math.ceil(rows / seriesCount);
  const readings = Array.from({ length: seriesCount }, (_, k) => {
    const s = k + 1;
    const values = new Float64Array(hours).map((_, h) => {
      if (h * seriesCount + s > rows || (h + s * 977) % 5003 === 0) return Number.NaN;
      const noise = (((s * 2654435761 + h * 40503) >>> 0) % 1000) / 1000 - 0.5;
      return Number((400 + 40 * s + 120 * Math.sin(((h % 24) / 24) * 2 * Math.PI - Math.PI / 2) + 8 * noise).toFixed(1));
    });
    return { seriesId: s, startMs: start, intervalMs: hourMs, values };
  });
  const written = await db.transaction((tx) => insertObservations(tx, readings));
  return { status: 'done' as const, rows: written, findings: { total: 0 } };
}

const { adminUrl } = await ensurePostgres();
const name = `lw_bench_intake_${process.pid}`;
await createDatabase(adminUrl, name);
const url = new URL(adminUrl);
url.pathname = `/${name}`;
const path = join(tmpdir(), `lw-bench-intake-${process.pid}.csv`);
try {
  await migrate(url.toString());
  const { db, pool, close } = createDb(url.toString(), { max: 3 });
  await db.insert(series).values(
    Array.from({ length: seriesCount }, (_, i) => ({
      key: `fdr-${i + 1}`,
      name: `Feeder ${i + 1}`,
      kind: 'load' as const,
      level: 'feeder' as const,
      unit: 'kW' as const,
      intervalMinutes: 60,
      timeZone: 'America/Chicago',
    })),
  );
  const fileRows = await writeLoadFile(path, rows, seriesCount);
  const bytes = (await stat(path)).size;
  const [upload] = await db
    .insert(uploads)
    .values({
      fileName: 'bench.csv',
      contentSha256: `bench-${rows}`,
      byteSize: bytes,
      status: 'queued',
      storagePath: path,
      mapping: { layout: 'long', timestampColumn: 'timestamp', valueColumn: 'value_kw', seriesKeyColumn: 'series', seriesKey: null },
      settings: {
        unit: 'kW',
        timeZone: 'America/Chicago',
        timestampsMark: 'start',
        repeatedHourPolicy: 'reject',
        decimalSeparator: '.',
        estimateShortGaps: true,
      },
    })
    .returning({ id: uploads.id });

  global.gc?.();
  const baselineRss = process.memoryUsage().rss;
  let peakRss = baselineRss;
  let peakHeap = process.memoryUsage().heapUsed;
  const sampler = setInterval(() => {
    const memory = process.memoryUsage();
    peakRss = Math.max(peakRss, memory.rss);
    peakHeap = Math.max(peakHeap, memory.heapUsed);
  }, 20);
  const began = performance.now();
  const reference = args.mode === 'reference' || args.mode === 'reference-unindexed';
  if (args.mode === 'reference-unindexed') {
    await pool.query('alter table observations drop constraint observations_pkey');
    await pool.query('alter table observations disable trigger user');
  }
  const outcome = reference ? await referenceInsert(db) : await importUpload({ db, pool }, upload!.id);
  const seconds = (performance.now() - began) / 1000;
  clearInterval(sampler);
  if (outcome.status !== 'done') throw new Error(`import ended ${outcome.status}: ${JSON.stringify(outcome)}`);
  const stored = Number((await pool.query('select count(*) as n from observations')).rows[0].n);
  await close();
  console.log(
    JSON.stringify({
      rows: fileRows,
      fileBytes: bytes,
      seconds,
      rowsPerSecond: Math.round(outcome.rows / seconds),
      stored,
      findings: outcome.findings.total,
      baselineRssMiB: Math.round(baselineRss / 1048576),
      peakRssMiB: Math.round(peakRss / 1048576),
      rssGrowthMiB: Math.round((peakRss - baselineRss) / 1048576),
      peakHeapMiB: Math.round(peakHeap / 1048576),
      stages: 'stages' in outcome ? outcome.stages : null,
    }),
  );
} finally {
  await rm(path, { force: true });
  await dropDatabase(adminUrl, name);
}
