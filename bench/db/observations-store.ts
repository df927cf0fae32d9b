/**
 * Measures candidate layouts of the observations store on a real PostgreSQL: bulk-load rate (COPY,
 * and batched `INSERT … SELECT unnest(…)` which needs nothing beyond `pg`), table and index bytes
 * per row, and read times for the two questions the product asks most:
 *   - one series, last 365 days (history chart, model training window);
 *   - one hour across all series (miss evaluation, system overview).
 *
 * Each design gets its own database on the server named by --admin-url, created and dropped here.
 *
 * Usage:
 *   node --import tsx bench/db/observations-store.ts \
 *     --admin-url postgres://postgres@127.0.0.1:54329/postgres --series 2000 --days 365 \
 *     --designs plain,hash16,revkey [--keep]
 */
import { spawn } from 'node:child_process';
import { once } from 'node:events';
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { parseArgs } from 'node:util';
import pg from 'pg';

/** One layout under test: its DDL and the query text for the two reads. */
interface Design {
  name: string;
  description: string;
  ddl: string[];
  /** Readings of one series in [from, to): $1 series, $2 from, $3 to. */
  seriesRange: string;
  /** Readings of every series at one instant: $1 ts. */
  hourAcross: string;
}

/** Columns shared by every design, in alignment-friendly order (8-byte, then 4-byte, then 2-byte). */
const currentColumns = `
  ts timestamptz not null,
  value double precision,
  series_id integer not null references series(id) on delete cascade,
  upload_id integer references uploads(id),
  quality smallint not null default 0,
  revision smallint not null default 1,
  estimated double precision`;

const catalogueDdl = [
  'create table series (id integer primary key, key text not null unique)',
  'create table uploads (id integer primary key)',
];

/** History of superseded readings, for the designs whose merge path is measured. */
const revisionsDdl = `create table observation_revisions (
  ts timestamptz not null, value double precision, superseded_at timestamptz not null default now(),
  series_id integer not null, upload_id integer, superseded_by_upload_id integer,
  quality smallint not null, revision smallint not null, estimated double precision,
  primary key (series_id, ts, revision))`;

const singleCurrentReads = {
  seriesRange: 'select ts, value, estimated, quality from observations where series_id = $1 and ts >= $2 and ts < $3 order by ts',
  hourAcross: 'select s.id, o.value, o.estimated, o.quality from series s join observations o on o.series_id = s.id and o.ts = $1',
};

/** The candidates. `plain` is the layout the migrations create. */
const designs: Record<string, Design> = {
  plain: {
    name: 'plain',
    description: 'one table, PK (series_id, ts), current revision only (history in a side table)',
    ddl: [...catalogueDdl, `create table observations (${currentColumns}, primary key (series_id, ts))`, revisionsDdl],
    ...singleCurrentReads,
  },
  nofk: {
    name: 'nofk',
    description: 'as plain, without the foreign keys to series and uploads (no per-row FK check)',
    ddl: [
      ...catalogueDdl,
      `create table observations (${currentColumns.replace(/ references [a-z]+\(id\)( on delete cascade)?/g, '')}, primary key (series_id, ts))`,
      revisionsDdl,
    ],
    ...singleCurrentReads,
  },
  stmtcheck: {
    name: 'stmtcheck',
    description: 'as nofk, with statement-level triggers checking series and uploads once per statement',
    ddl: [
      ...catalogueDdl,
      `create table observations (${currentColumns.replace(/ references [a-z]+\(id\)( on delete cascade)?/g, '')}, primary key (series_id, ts))`,
      revisionsDdl,
      ...readFileSync(new URL('../../drizzle/0004_observations_set_based_reference_checks.sql', import.meta.url), 'utf8')
        .split('--> statement-breakpoint')
        .filter((statement) => /observations_references_guard\(\)/.test(statement) && !/^\s*ALTER/.test(statement)),
    ],
    ...singleCurrentReads,
  },
  seriesfk: {
    name: 'seriesfk',
    description: 'as plain, keeping the foreign key to series but not the one to uploads',
    ddl: [
      ...catalogueDdl,
      `create table observations (${currentColumns.replace(/ references uploads\(id\)/, '')}, primary key (series_id, ts))`,
    ],
    ...singleCurrentReads,
  },
  hash16: {
    name: 'hash16',
    description: 'same columns and PK, hash-partitioned by series_id into 16 partitions',
    ddl: [
      ...catalogueDdl,
      `create table observations (${currentColumns}, primary key (series_id, ts)) partition by hash (series_id)`,
      ...Array.from(
        { length: 16 },
        (_, i) => `create table observations_p${i} partition of observations for values with (modulus 16, remainder ${i})`,
      ),
    ],
    ...singleCurrentReads,
  },
  monthly: {
    name: 'monthly',
    description: 'same columns and PK, range-partitioned by month of ts',
    ddl: [...catalogueDdl, `create table observations (${currentColumns}, primary key (series_id, ts)) partition by range (ts)`],
    ...singleCurrentReads,
  },
  revkey: {
    name: 'revkey',
    description: 'every revision in one table, PK (series_id, ts, revision); reads pick the highest revision',
    ddl: [...catalogueDdl, `create table observations (${currentColumns}, primary key (series_id, ts, revision))`],
    seriesRange:
      'select distinct on (ts) ts, value, estimated, quality from observations where series_id = $1 and ts >= $2 and ts < $3 order by ts, revision desc',
    hourAcross:
      'select s.id, o.value, o.estimated, o.quality from series s cross join lateral (select value, estimated, quality from observations where series_id = s.id and ts = $1 order by revision desc limit 1) o',
  },
};

const hourMs = 3_600_000;
const { values: args } = parseArgs({
  options: {
    'admin-url': { type: 'string', default: process.env['BENCH_ADMIN_URL'] ?? 'postgres://postgres@127.0.0.1:54329/postgres' },
    series: { type: 'string', default: '2000' },
    days: { type: 'string', default: '365' },
    designs: { type: 'string', default: 'plain,hash16' },
    'insert-rows': { type: 'string', default: '500000' },
    psql: { type: 'string', default: '/usr/lib/postgresql/15/bin/psql' },
    keep: { type: 'boolean', default: false },
  },
});

const seriesCount = Number(args.series);
const days = Number(args.days);
const insertRows = Number(args['insert-rows']);
const start = Date.UTC(2024, 0, 1);
const hours = days * 24;
const end = start + hours * hourMs;

/** Deterministic load-like value: daily cycle plus a per-series level and a little hash noise. */
function reading(seriesId: number, hour: number): number {
  const daily = Math.sin(((hour % 24) / 24) * 2 * Math.PI - Math.PI / 2);
  const noise = (((seriesId * 2654435761 + hour * 40503) >>> 0) % 1000) / 1000 - 0.5;
  return Math.round((10 + seriesId * 0.01 + 3 * daily + noise) * 1000) / 1000;
}

/**
 * Streams the rows to `COPY … FROM STDIN` through psql, in the order intake would write them if
 * every series were uploaded month by month: 30-day blocks, series by series inside a block. That
 * scatters one series' year over 12 places in the heap, a fair middle between one big history
 * upload (perfectly clustered) and hourly pushes (fully interleaved).
 */
async function copyLoad(url: string): Promise<{ rows: number; seconds: number }> {
  const child = spawn(
    args.psql,
    [
      url,
      '-v',
      'ON_ERROR_STOP=1',
      '-q',
      '-c',
      '\\copy observations (ts, value, series_id, upload_id, quality, revision) from stdin with (format text)',
    ],
    {
      stdio: ['pipe', 'inherit', 'inherit'],
    },
  );
  const began = performance.now();
  let rows = 0;
  const blockHours = 30 * 24;
  for (let blockStart = 0; blockStart < hours; blockStart += blockHours) {
    const blockEnd = Math.min(hours, blockStart + blockHours);
    for (let id = 1; id <= seriesCount; id++) {
      const lines: string[] = [];
      for (let h = blockStart; h < blockEnd; h++) {
        const ts = new Date(start + h * hourMs).toISOString();
        lines.push(`${ts}\t${reading(id, h)}\t${id}\t1\t0\t1\n`);
      }
      rows += lines.length;
      if (!child.stdin.write(lines.join(''))) await once(child.stdin, 'drain');
    }
  }
  child.stdin.end();
  const [code] = (await once(child, 'exit')) as [number];
  if (code !== 0) throw new Error(`psql COPY exited with ${code}`);
  return { rows, seconds: (performance.now() - began) / 1000 };
}

/**
 * Inserts `insertRows` further rows (the year after the loaded one) in batches of 10,000 through
 * `insert … select unnest($1::timestamptz[], …)`, the fastest bulk path the `pg` driver offers
 * without a COPY stream package.
 */
async function unnestInsert(client: pg.Client): Promise<{ rows: number; seconds: number }> {
  const batch = 10_000;
  const hoursPerSeries = Math.ceil(insertRows / seriesCount);
  const began = performance.now();
  let rows = 0;
  const ts: string[] = [];
  const value: number[] = [];
  const ids: number[] = [];
  const flush = async () => {
    if (!ts.length) return;
    await client.query(
      `insert into observations (ts, value, series_id, upload_id, quality, revision)
       select t, v, s, 1, 0, 1 from unnest($1::timestamptz[], $2::float8[], $3::int4[]) as u(t, v, s)`,
      [ts, value, ids],
    );
    rows += ts.length;
    ts.length = value.length = ids.length = 0;
  };
  for (let id = 1; id <= seriesCount && rows + ts.length < insertRows; id++) {
    for (let h = hours; h < hours + hoursPerSeries; h++) {
      ts.push(new Date(start + h * hourMs).toISOString());
      value.push(reading(id, h));
      ids.push(id);
      if (ts.length === batch) await flush();
    }
  }
  await flush();
  return { rows, seconds: (performance.now() - began) / 1000 };
}

/**
 * The intake write path of the chosen design: COPY an upload into a temporary table, copy the rows
 * it changes into observation_revisions, then upsert, skipping rows whose value is unchanged. The
 * batch mixes new hours (half), exact repeats (40 %) and corrections (10 %) over the loaded data.
 */
async function stagedMerge(url: string): Promise<{ rows: number; seconds: number; revised: number }> {
  const merge = [
    `create temp table incoming (ts timestamptz, value float8, series_id int, quality smallint, estimated float8)`,
    '\\copy incoming (ts, value, series_id, quality) from stdin with (format text)',
    `insert into observation_revisions (ts, value, superseded_at, series_id, upload_id, superseded_by_upload_id, quality, revision, estimated)
       select o.ts, o.value, now(), o.series_id, o.upload_id, 2, o.quality, o.revision, o.estimated
       from incoming i join observations o on o.series_id = i.series_id and o.ts = i.ts
       where o.value is distinct from i.value`,
    `insert into observations (ts, value, series_id, upload_id, quality, revision, estimated)
       select ts, value, series_id, 2, quality, 1, estimated from incoming
       on conflict (series_id, ts) do update
         set value = excluded.value, upload_id = excluded.upload_id, quality = excluded.quality,
             estimated = excluded.estimated, revision = observations.revision + 1
         where observations.value is distinct from excluded.value`,
  ];
  const child = spawn(args.psql, [url, '-v', 'ON_ERROR_STOP=1', '-q', '-1', ...merge.flatMap((c) => ['-c', c])], {
    stdio: ['pipe', 'inherit', 'inherit'],
  });
  const began = performance.now();
  const perSeries = Math.ceil(insertRows / seriesCount);
  let rows = 0;
  let revised = 0;
  for (let id = 1; id <= seriesCount && rows < insertRows; id++) {
    const lines: string[] = [];
    // New hours after everything loaded so far, for half of the batch.
    const newFrom = hours + Math.ceil(insertRows / seriesCount);
    for (let k = 0; k < perSeries / 2; k++) {
      const h = newFrom + k;
      lines.push(`${new Date(start + h * hourMs).toISOString()}\t${reading(id, h)}\t${id}\t0\n`);
    }
    // Repeats of the last loaded hours; every fifth one corrected.
    for (let k = 0; k < perSeries / 2; k++) {
      const h = hours - 1 - k;
      const corrected = k % 5 === 0;
      if (corrected) revised++;
      const value = corrected ? reading(id, h) + 1 : reading(id, h);
      lines.push(`${new Date(start + h * hourMs).toISOString()}\t${value}\t${id}\t0\n`);
    }
    rows += lines.length;
    if (!child.stdin.write(lines.join(''))) await once(child.stdin, 'drain');
  }
  child.stdin.end();
  const [code] = (await once(child, 'exit')) as [number];
  if (code !== 0) throw new Error(`psql merge exited with ${code}`);
  return { rows, seconds: (performance.now() - began) / 1000, revised };
}

/** Median and 95th percentile of a list of milliseconds. */
function summarise(ms: number[]): { median: number; p95: number } {
  const sorted = [...ms].sort((a, b) => a - b);
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!;
  return { median: Math.round(at(0.5) * 100) / 100, p95: Math.round(at(0.95) * 100) / 100 };
}

/**
 * Times `runs` executions of a query with varying parameters. `firstRun` is the first touch of
 * those rows (PostgreSQL's buffers are cold for them; the OS cache may not be), `repeatRun` the
 * same query again at once, both measured at the client including row decoding. `server` is the
 * executor's own time from EXPLAIN ANALYZE on a third run, with the pages it touched.
 */
async function timeQuery(client: pg.Client, text: string, params: (i: number) => unknown[], runs: number) {
  const first: number[] = [];
  const repeat: number[] = [];
  const server: number[] = [];
  const pages: number[] = [];
  let rows = 0;
  for (let i = 0; i < runs; i++) {
    const p = params(i);
    let began = performance.now();
    const result = await client.query(text, p);
    first.push(performance.now() - began);
    rows = result.rowCount ?? 0;
    began = performance.now();
    await client.query(text, p);
    repeat.push(performance.now() - began);
    const explained = await client.query(`explain (analyze, buffers, format json) ${text}`, p);
    const plan = (explained.rows[0] as { 'QUERY PLAN': [{ 'Execution Time': number; Plan: Record<string, number> }] })['QUERY PLAN'][0];
    server.push(plan['Execution Time']);
    pages.push((plan.Plan['Shared Hit Blocks'] ?? 0) + (plan.Plan['Shared Read Blocks'] ?? 0));
  }
  return {
    rows,
    firstRun: summarise(first),
    repeatRun: summarise(repeat),
    server: summarise(server),
    pagesTouched: summarise(pages).median,
  };
}

/** Table and index bytes of observations, summed over partitions when partitioned. */
async function sizes(client: pg.Client): Promise<{ table: number; indexes: number; rows: number }> {
  const { rows } = await client.query<{ table: string; indexes: string; rows: string }>(`
    select sum(pg_table_size(relid))::bigint as table, sum(pg_indexes_size(relid))::bigint as indexes,
           (select count(*) from observations)::bigint as rows
    from (select 'observations'::regclass as relid
          union select inhrelid from pg_inherits where inhparent = 'observations'::regclass) tree`);
  return { table: Number(rows[0]!.table), indexes: Number(rows[0]!.indexes), rows: Number(rows[0]!.rows) };
}

/** Monthly partitions covering the loaded year and the unnest-insert year after it. */
function monthlyPartitions(): string[] {
  const ddl: string[] = [];
  const first = new Date(start);
  for (let m = 0; m < Math.ceil((days * 2) / 28) + 1; m++) {
    const from = new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth() + m, 1));
    const to = new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth() + m + 1, 1));
    ddl.push(
      `create table observations_m${m} partition of observations for values from ('${from.toISOString()}') to ('${to.toISOString()}')`,
    );
  }
  return ddl;
}

async function benchDesign(design: Design) {
  const dbName = `lw_bench_obs_${design.name}`;
  const admin = new pg.Client({ connectionString: args['admin-url'] });
  await admin.connect();
  await admin.query(`drop database if exists ${dbName} with (force)`);
  await admin.query(`create database ${dbName}`);
  const url = new URL(args['admin-url']!);
  url.pathname = `/${dbName}`;
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    for (const statement of design.ddl) await client.query(statement);
    if (design.name === 'monthly') for (const statement of monthlyPartitions()) await client.query(statement);
    await client.query(
      `insert into series select i, 'S' || i from generate_series(1, ${seriesCount}) i; insert into uploads values (1), (2)`,
    );
    const loadBefore = loadavg()[0]!;
    const copy = await copyLoad(url.toString());
    await client.query('vacuum analyze observations');
    const stored = await sizes(client);
    const fromTs = new Date(end - 365 * 24 * hourMs);
    const seriesRange = await timeQuery(client, design.seriesRange, (i) => [1 + ((i * 7919) % seriesCount), fromTs, new Date(end)], 20);
    const hourAcross = await timeQuery(client, design.hourAcross, (i) => [new Date(start + ((i * 7_349) % hours) * hourMs)], 20);
    const insert = await unnestInsert(client);
    const merged = design.ddl.includes(revisionsDdl) ? await stagedMerge(url.toString()) : undefined;
    const revisions = merged ? Number((await client.query('select count(*) as n from observation_revisions')).rows[0].n) : undefined;
    return {
      design: design.name,
      description: design.description,
      /** 1-minute load average before and after, on a machine others share: rates vary with it. */
      loadAverage: { before: round(loadBefore), after: round(loadavg()[0]!) },
      copy: { rows: copy.rows, seconds: round(copy.seconds), rowsPerSecond: Math.round(copy.rows / copy.seconds) },
      unnestInsert: { rows: insert.rows, seconds: round(insert.seconds), rowsPerSecond: Math.round(insert.rows / insert.seconds) },
      stagedMerge: merged && {
        rows: merged.rows,
        seconds: round(merged.seconds),
        rowsPerSecond: Math.round(merged.rows / merged.seconds),
        correctionsSent: merged.revised,
        revisionsKept: revisions,
      },
      bytes: {
        table: stored.table,
        indexes: stored.indexes,
        tablePerRow: round(stored.table / stored.rows),
        indexesPerRow: round(stored.indexes / stored.rows),
        extrapolatedGiBAt175M: round((((stored.table + stored.indexes) / stored.rows) * 175_200_000) / 2 ** 30),
      },
      seriesLast365DaysMs: seriesRange,
      oneHourAllSeriesMs: hourAcross,
    };
  } finally {
    await client.end();
    if (!args.keep) await admin.query(`drop database if exists ${dbName} with (force)`);
    await admin.end();
  }
}

function round(x: number): number {
  return Math.round(x * 100) / 100;
}

const wanted = args.designs!.split(',').map((name) => {
  const design = designs[name];
  if (!design) throw new Error(`Unknown design "${name}". Choose from: ${Object.keys(designs).join(', ')}`);
  return design;
});
console.log(JSON.stringify({ series: seriesCount, days, rows: seriesCount * hours }));
for (const design of wanted) {
  console.log(JSON.stringify(await benchDesign(design), null, 2));
}
