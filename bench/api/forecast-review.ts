/**
 * One series' forecast review, `GET /api/series/:id/forecast`, under 50 concurrent clients, side by
 * side with a static file of the same size served by the same process through the same middleware
 * (the ceiling: what this process does for a response of that size without computing anything).
 * The demo co-op is seeded into a throwaway database; the system series gets an approved version, a
 * draft with two adjustments, and its actuals, as on a planner's morning. The server is a child
 * process (bench/api/serve-app.ts); this process only sends requests, over keep-alive connections
 * with a read token, each client sending its next request when the last one answered.
 *
 * Also measured: revalidation with If-None-Match (the answer is 304 while nothing changed).
 *
 * Each run also reports the CPU milliseconds per request of the server process and of its PostgreSQL
 * connections (from /proc): on a shared machine requests per second fall whenever something else takes
 * the cores, while CPU per request barely moves. The three runs are repeated FORECAST_BENCH_ROUNDS
 * times (default 3), interleaved, and the table gives each measure's median over the rounds.
 *
 * `npm run bench -- forecast-review`; FORECAST_BENCH_SECONDS (default 8) sets each run's length,
 * FORECAST_BENCH_PROFILE=<dir> has the server write a CPU profile there, FORECAST_BENCH_KEEP=1 keeps the
 * throwaway database (and prints its read token) for poking at by hand.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { apiTokens, createDb, forecastAdjustments, forecastVersions, series, users } from '@loadwright/db';
import { eq } from 'drizzle-orm';
import pg from 'pg';
import { newApiTokenSecret } from '../../apps/api/src/auth/api-token-secret';
import { migrate } from '../../libs/db/src/migrate';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { createDatabase, dropDatabase, ensurePostgres } from '../../scripts/postgres';
import { writeDraftVersion } from '../../tests/forecasts/support/draft-versions';
import type { Benchmark, BenchReport } from '../support/harness';
import { cpuBetween, cpuSnapshot } from '../support/process-cpu';

const repoRoot = resolve(import.meta.dirname, '../..');
const clients = 50;
/** Goals of issue 13 at 50 concurrent clients. */
const goalPerSecond = 600;
const goalP95Ms = 150;
const hourMs = 3_600_000;

/** What one run of requests measured. */
interface LoadResult {
  requests: number;
  perSecond: number;
  p50Ms: number;
  p95Ms: number;
  p99Ms: number;
  statuses: Record<string, number>;
  bytes: number;
  /** CPU milliseconds per request of the server process. */
  serverCpuMs: number;
  /** CPU milliseconds per request of the server's PostgreSQL connections. */
  databaseCpuMs: number;
}

/** The processes whose CPU a run counts: the server and its PostgreSQL backends (found when asked). */
interface Measured {
  serverPid: number;
  databasePids(): Promise<number[]>;
}

/** Sends requests from `clients` loops for `seconds` over keep-alive connections; latencies per request. */
async function load(port: number, path: string, headers: Record<string, string>, seconds: number, measured: Measured): Promise<LoadResult> {
  const agent = new http.Agent({ keepAlive: true, maxSockets: clients });
  const latencies: number[] = [];
  const statuses: Record<string, number> = {};
  let bytes = 0;
  const deadline = performance.now() + seconds * 1000;
  const one = () =>
    new Promise<void>((done, fail) => {
      const started = performance.now();
      const request = http.get({ host: '127.0.0.1', port, path, agent, headers }, (response) => {
        let size = 0;
        response.on('data', (chunk: Buffer) => (size += chunk.length));
        response.on('end', () => {
          latencies.push(performance.now() - started);
          statuses[String(response.statusCode)] = (statuses[String(response.statusCode)] ?? 0) + 1;
          bytes = size;
          done();
        });
      });
      request.on('error', fail);
    });
  const backendsBefore = await measured.databasePids();
  const serverBefore = cpuSnapshot([measured.serverPid]);
  const databaseBefore = cpuSnapshot(backendsBefore);
  const started = performance.now();
  await Promise.all(
    Array.from({ length: clients }, async () => {
      while (performance.now() < deadline) await one();
    }),
  );
  const elapsed = (performance.now() - started) / 1000;
  const serverCpu = cpuBetween(serverBefore, cpuSnapshot([measured.serverPid]));
  // Backends opened during the run count from zero; those that closed during it are lost (rare: the pool keeps them).
  const databaseCpu = cpuBetween(databaseBefore, cpuSnapshot([...new Set([...backendsBefore, ...(await measured.databasePids())])]));
  agent.destroy();
  const sorted = latencies.sort((a, b) => a - b);
  const at = (share: number) => Math.round(sorted[Math.min(sorted.length - 1, Math.floor(share * sorted.length))]! * 10) / 10;
  return {
    requests: sorted.length,
    perSecond: Math.round(sorted.length / elapsed),
    p50Ms: at(0.5),
    p95Ms: at(0.95),
    p99Ms: at(0.99),
    statuses,
    bytes,
    serverCpuMs: Math.round((serverCpu / sorted.length) * 1000) / 1000,
    databaseCpuMs: Math.round((databaseCpu / sorted.length) * 1000) / 1000,
  };
}

/** The median of some numbers. */
function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

/** One result whose every measure is the median of the rounds' (statuses summed over them). */
function medianOf(results: LoadResult[]): LoadResult {
  const statuses: Record<string, number> = {};
  for (const result of results)
    for (const [status, count] of Object.entries(result.statuses)) statuses[status] = (statuses[status] ?? 0) + count;
  const of = (measure: (result: LoadResult) => number) => median(results.map(measure));
  return {
    requests: of((r) => r.requests),
    perSecond: of((r) => r.perSecond),
    p50Ms: of((r) => r.p50Ms),
    p95Ms: of((r) => r.p95Ms),
    p99Ms: of((r) => r.p99Ms),
    statuses,
    bytes: results[0]!.bytes,
    serverCpuMs: of((r) => r.serverCpuMs),
    databaseCpuMs: of((r) => r.databaseCpuMs),
  };
}

/** One GET's status, headers and body. */
function fetchOnce(port: number, path: string, headers: Record<string, string>) {
  return fetch(`http://127.0.0.1:${port}${path}`, { headers });
}

/** The benchmark. */
export const bench: Benchmark = {
  name: 'forecast-review',
  description: 'GET /api/series/:id/forecast at 50 concurrent clients against a static file of the same size from the same process',
  async run(): Promise<BenchReport> {
    const seconds = Number(process.env['FORECAST_BENCH_SECONDS'] ?? 8);
    const rounds = Math.max(1, Number(process.env['FORECAST_BENCH_ROUNDS'] ?? 3));
    const { adminUrl } = await ensurePostgres();
    const name = `bench_forecast_${process.pid}`;
    await createDatabase(adminUrl, name);
    const url = new URL(adminUrl);
    url.pathname = `/${name}`;
    const databaseUrl = url.toString();
    const staticFolder = mkdtempSync(join(tmpdir(), 'lw-bench-static-'));
    let child: ReturnType<typeof spawn> | undefined;
    // Finds the server's PostgreSQL backends by the application name serve-app.ts gives its pool.
    const watcher = new pg.Client({ connectionString: databaseUrl });
    try {
      await migrate(databaseUrl);
      await seedDemo(databaseUrl);
      const { db, close } = createDb(databaseUrl, { max: 2 });
      const [system] = await db.select({ id: series.id }).from(series).where(eq(series.level, 'system'));
      const now = Math.floor(Date.now() / hourMs) * hourMs;
      const first = await writeDraftVersion(db, {
        seriesId: system!.id,
        origin: new Date(now - 24 * hourMs),
        mean: (i) => 900 + 200 * Math.sin(i / 4),
      });
      await db.update(forecastVersions).set({ state: 'approved', approvedAt: new Date() }).where(eq(forecastVersions.id, first));
      const draft = await writeDraftVersion(db, { seriesId: system!.id, origin: new Date(now), mean: (i) => 950 + 210 * Math.sin(i / 4) });
      await db.insert(forecastAdjustments).values([
        {
          versionId: draft,
          periodStart: new Date(now + 30 * hourMs),
          periodEnd: new Date(now + 40 * hourMs),
          kind: 'scale',
          amount: 1.05,
          reason: 'Heat advisory',
        },
        {
          versionId: draft,
          periodStart: new Date(now + 50 * hourMs),
          periodEnd: new Date(now + 54 * hourMs),
          kind: 'shift',
          amount: -40,
          reason: 'Plant outage',
        },
      ]);
      const { token, prefix, hash } = newApiTokenSecret();
      if (process.env['FORECAST_BENCH_KEEP']) console.log(`token ${token}`);
      // A token acts for its creator: made by the demo's active admin, as on the tokens page.
      const [admin] = await db.select({ id: users.id }).from(users).where(eq(users.role, 'admin')).limit(1);
      await db.insert(apiTokens).values({ name: 'bench reader', prefix, secretHash: hash, scope: 'read', createdById: admin!.id });
      await close();

      // The folder is the server's web app: it needs an index.html to be served at all.
      writeFileSync(join(staticFolder, 'index.html'), '<!doctype html><title>bench</title>');
      child = spawn(
        process.execPath,
        [
          ...(process.env['FORECAST_BENCH_PROFILE'] ? ['--cpu-prof', `--cpu-prof-dir=${process.env['FORECAST_BENCH_PROFILE']}`] : []),
          '--import',
          'tsx',
          resolve(repoRoot, 'bench/api/serve-app.ts'),
          databaseUrl,
          staticFolder,
        ],
        {
          cwd: repoRoot,
          stdio: ['ignore', 'pipe', 'inherit'],
        },
      );
      const port = await new Promise<number>((done, fail) => {
        child!.stdout!.on('data', (chunk: Buffer) => {
          const match = /listening (\d+)/.exec(chunk.toString());
          if (match) done(Number(match[1]));
        });
        child!.once('exit', (code) => fail(new Error(`the server exited with ${code}`)));
      });

      const path = `/api/series/${system!.id}/forecast`;
      const auth = { Authorization: `Bearer ${token}` };
      const sample = await fetchOnce(port, path, auth);
      const body = await sample.text();
      if (sample.status !== 200) throw new Error(`the forecast answered ${sample.status}: ${body.slice(0, 200)}`);
      const etag = sample.headers.get('etag');
      // The ceiling: a file of exactly the JSON's size, served by the same process as its web app.
      writeFileSync(join(staticFolder, 'same-size.json'), body);

      await watcher.connect();
      const measured: Measured = {
        serverPid: child.pid!,
        databasePids: async () =>
          (
            await watcher.query<{ pid: number }>(
              "select pid from pg_stat_activity where datname = current_database() and application_name = 'loadwright-bench'",
            )
          ).rows.map((row) => row.pid),
      };
      await load(port, path, auth, 1.5, measured); // warm-up: JIT, connection pools
      const routeRuns: LoadResult[] = [];
      const staticRuns: LoadResult[] = [];
      const revalidateRuns: LoadResult[] = [];
      for (let round = 0; round < rounds; round++) {
        routeRuns.push(await load(port, path, auth, seconds, measured));
        staticRuns.push(await load(port, '/same-size.json', {}, seconds, measured));
        if (etag) revalidateRuns.push(await load(port, path, { ...auth, 'If-None-Match': etag }, seconds, measured));
      }
      const routeRun = medianOf(routeRuns);
      const staticRun = medianOf(staticRuns);
      const revalidateRun = etag ? medianOf(revalidateRuns) : null;

      const row = (what: string, result: LoadResult) => ({
        what,
        'req/s': result.perSecond,
        'p50 ms': result.p50Ms,
        'p95 ms': result.p95Ms,
        'p99 ms': result.p99Ms,
        'API CPU ms/req': result.serverCpuMs,
        'DB CPU ms/req': result.databaseCpuMs,
        requests: result.requests,
        statuses: Object.entries(result.statuses)
          .map(([status, count]) => `${status}×${count}`)
          .join(' '),
      });
      const rows = [row(`GET ${path} (${body.length} B JSON)`, routeRun), row(`static file, ${body.length} B`, staticRun)];
      if (revalidateRun) rows.push(row('GET forecast with If-None-Match (304)', revalidateRun));
      return {
        rows,
        notes: [
          `${clients} concurrent keep-alive clients, ${seconds} s per run after a 1.5 s warm-up, medians of ${rounds} interleaved rounds; server and clients share this machine's cores`,
          `route / static throughput: ${(routeRun.perSecond / staticRun.perSecond).toFixed(2)}; route / static API CPU per request: ${(routeRun.serverCpuMs / staticRun.serverCpuMs).toFixed(2)}`,
          `route req/s by round: ${routeRuns.map((r) => r.perSecond).join(', ')}; static: ${staticRuns.map((r) => r.perSecond).join(', ')}`,
          `response ${body.length} bytes uncompressed; ETag ${etag ?? 'none'}`,
        ],
        checks: [
          { name: `≥ ${goalPerSecond} requests/s`, passed: routeRun.perSecond >= goalPerSecond, detail: `${routeRun.perSecond} req/s` },
          { name: `p95 ≤ ${goalP95Ms} ms`, passed: routeRun.p95Ms <= goalP95Ms, detail: `p95 ${routeRun.p95Ms} ms` },
          {
            name: 'every request answered 200',
            passed: Object.keys(routeRun.statuses).join() === '200',
            detail: JSON.stringify(routeRun.statuses),
          },
          ...(revalidateRun
            ? [
                {
                  name: 'revalidation answers 304',
                  passed: Object.keys(revalidateRun.statuses).join() === '304',
                  detail: JSON.stringify(revalidateRun.statuses),
                },
              ]
            : []),
        ],
        data: {
          route: routeRun,
          static: staticRun,
          revalidate: revalidateRun,
          rounds: { route: routeRuns, static: staticRuns, revalidate: revalidateRuns },
          bytes: body.length,
          clients,
          seconds,
        },
      };
    } finally {
      await watcher.end().catch(() => {});
      child?.kill();
      rmSync(staticFolder, { recursive: true, force: true });
      if (!process.env['FORECAST_BENCH_KEEP']) await dropDatabase(adminUrl, name).catch(() => {});
    }
  },
};
