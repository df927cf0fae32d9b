/**
 * At volume: a group of 2,000 feeders with weekly drafts is previewed and bulk-approved in one
 * transaction, then the whole system (336,000 rows) streams out as CSV without the file ever being
 * held in memory, and the download completes with every row.
 */
import { get } from 'node:http';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { apiTokens } from '@loadwright/db';
import { approvalPreviewSchema } from '@loadwright/contracts';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { newApiTokenSecret } from '../../apps/api/src/auth/api-token-secret';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { asBrowser } from './support/forecast-server';

const seriesCount = 2_000;
const hours = 168;
let server: TestServer;
let token: string;
let planner: SignedIn;
let rootId: number;

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  const people = await createPeople(server.db);
  const secret = newApiTokenSecret();
  await server.db
    .insert(apiTokens)
    .values({ name: 'volume', prefix: secret.prefix, secretHash: secret.hash, scope: 'read', createdById: people.admin.id });
  token = secret.token;
  planner = await signIn(server.url, people.planner.email);
  const root = await server.pool.query<{ id: number }>(
    `insert into series (key, name, kind, level, unit, time_zone) values ('vol-root', 'Volume system', 'load', 'system', 'MW', 'America/Chicago') returning id`,
  );
  rootId = root.rows[0]!.id;
  // Feeders, fits, drafts and points written set-wise, as a nightly run would leave them.
  await server.pool.query(`
    insert into series (key, name, kind, level, parent_id, unit, time_zone)
      select 'vol-' || n, 'Volume feeder ' || n, 'load', 'feeder', ${rootId}, 'kW', 'America/Chicago' from generate_series(1, ${seriesCount}) n;
    insert into fits (series_id, spec_snapshot, method, parameters, data_start, data_end, observation_count, data_hash, duration_ms)
      select id, '{}', 'yule_walker', '{}', '2025-12-01', '2026-11-30', 8760, 'h' || id, 1 from series where parent_id = ${rootId};
    insert into forecast_versions (series_id, fit_id, origin, horizon_hours)
      select series_id, id, '2026-12-03T06:00:00Z', ${hours} from fits where data_hash like 'h%';
    insert into forecast_points (version_id, ts, mean, std_error, lower_80, upper_80, lower_95, upper_95)
      select v.id, v.origin + make_interval(hours => h), 1000 + h, 10, 987, 1013 + h, 980, 1020 + h
        from forecast_versions v, generate_series(0, ${hours - 1}) h;
  `);
}, 180_000);
afterAll(() => server.close());

it(`previews and bulk-approves a group of ${seriesCount} drafts in one transaction`, async () => {
  const as = asBrowser(server.url, planner);
  let started = performance.now();
  const previewResponse = await as.post('/api/forecast-approvals/preview', { parentId: rootId });
  const previewSeconds = (performance.now() - started) / 1000;
  expect(previewResponse.status).toBe(200);
  const preview = approvalPreviewSchema.parse(previewResponse.body);
  expect(preview.versionIds).toHaveLength(seriesCount);
  expect(preview.items[1]!.draft!.peak).toMatchObject({ value: 1000 + hours - 1 });
  started = performance.now();
  const approval = await as.post('/api/forecast-approvals', { versionIds: preview.versionIds });
  const approveSeconds = (performance.now() - started) / 1000;
  expect(approval.status).toBe(200);
  expect(approval.body.approved).toHaveLength(seriesCount);
  console.info(`group of ${seriesCount}: preview ${previewSeconds.toFixed(2)} s, bulk approval ${approveSeconds.toFixed(2)} s`);
  const { rows } = await server.pool.query(`select state, count(*)::int as n from forecast_versions group by state`);
  expect(rows).toEqual([{ state: 'approved', n: seriesCount }]);
}, 120_000);

/** A full garbage collection, so the heap measures what is still held rather than garbage not yet swept. */
setFlagsFromString('--expose-gc');
const collectGarbage = runInNewContext('gc') as () => void;

/** Heap in use after a full collection. */
function liveHeap(): number {
  collectGarbage();
  return process.memoryUsage().heapUsed;
}

it(`streams ${seriesCount} series × ${hours} h as CSV with the server's heap staying well below the file's size`, async () => {
  const heapBefore = liveHeap();
  let heapPeak = heapBefore;
  const sampler = setInterval(() => (heapPeak = Math.max(heapPeak, liveHeap())), 250);
  const started = performance.now();
  const { bytes, lines, chunks } = await new Promise<{ bytes: number; lines: number; chunks: number }>((resolve, reject) => {
    get(`${server.url}/api/exports/forecasts.csv?tz=America/Chicago`, { headers: { Authorization: `Bearer ${token}` } }, (response) => {
      expect(response.statusCode).toBe(200);
      let bytes = 0;
      let lines = 0;
      let chunks = 0;
      response.on('data', (chunk: Buffer) => {
        bytes += chunk.length;
        chunks++;
        for (const byte of chunk) if (byte === 10) lines++;
      });
      response.on('end', () => resolve({ bytes, lines, chunks }));
      response.on('error', reject);
    }).on('error', reject);
  });
  clearInterval(sampler);
  const seconds = (performance.now() - started) / 1000;
  const rows = lines - 1;
  console.info(
    `export: ${rows} rows, ${(bytes / 1e6).toFixed(1)} MB in ${seconds.toFixed(2)} s (${Math.round(rows / seconds)} rows/s), ${chunks} chunks, live heap growth peak ${((heapPeak - heapBefore) / 1e6).toFixed(1)} MB`,
  );
  expect(rows).toBe(seriesCount * hours);
  expect(chunks).toBeGreaterThan(100);
  // Server and client share one process; what either holds at any moment stays a small part of the file.
  expect(heapPeak - heapBefore).toBeLessThan(bytes / 4);
});
