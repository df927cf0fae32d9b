/**
 * Actions that hand work to the job queue commit with their audit entry or not at all: starting a
 * refit (the run, its series and their jobs), cancelling a queued import (the upload's status and its
 * file) and resending an invite (the new link, its mail and the mail's job). The database is made to
 * refuse every audit insert with a trigger, as a full disk or a bad value would; each action must then
 * fail and leave everything as it was. Job queues exist but no worker runs, so queued jobs stay put.
 */
import { existsSync } from 'node:fs';
import { series } from '@loadwright/db';
import { createImportQueue } from '@loadwright/intake';
import { createMailQueue } from '@loadwright/mail';
import { createRefitQueues } from '@loadwright/refits';
import type PgBoss from 'pg-boss';
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createBoss } from '../../jobs/boss';
import { confirm, postFile } from '../intake/upload-client';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;
let boss: PgBoss;
let admin: SignedIn;
let feederId: number;

const asAdmin = () => ({ Cookie: admin.cookie.join('; '), 'X-CSRF-Token': admin.csrf });

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  admin = await signIn(server.url, (await createPeople(server.db)).admin.email);
  const [feeder] = await server.db
    .insert(series)
    .values({ key: 'tv-f301', name: 'Tallowmere F301', kind: 'load', level: 'feeder', unit: 'kW', intervalMinutes: 60, timeZone: 'UTC' })
    .returning({ id: series.id });
  feederId = feeder!.id;
  // The queues a worker would create, without a worker taking their jobs.
  boss = createBoss(server.databaseUrl, { supervise: false });
  boss.on('error', () => undefined);
  await boss.start();
  await createRefitQueues(boss);
  await createImportQueue(boss);
  await createMailQueue(boss);
});
afterAll(async () => {
  await boss.stop({ wait: true, timeout: 5_000 });
  await server.close();
});

/** Rows per table of the product, and jobs per queue. */
async function rowCounts(): Promise<Record<string, number>> {
  const { rows: tables } = await server.pool.query<{ name: string }>(
    `select table_name as name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE'`,
  );
  const { rows } = await server.pool.query<{ name: string; count: number }>(
    [
      ...tables.map((t) => `select '${t.name}' as name, count(*)::int as count from "${t.name}"`),
      `select 'job ' || name, count(*)::int from pgboss.job group by name`,
    ].join(' union all '),
  );
  return Object.fromEntries(rows.map((r) => [r.name, r.count]));
}

/** One upload's status, message and stored file. */
async function uploadState(id: number) {
  const { rows } = await server.pool.query<{ status: string; error: string | null; storage_path: string | null }>(
    'select status, error, storage_path from uploads where id = $1',
    [id],
  );
  return rows[0]!;
}

it('starts no refit, cancels no import and sends no invite when the audit entry cannot be stored', async () => {
  // While the audit log takes entries: a refit starts with its entry (and seeds the holiday calendar it reads).
  const first = await request(server.url)
    .post('/api/refits')
    .set(asAdmin())
    .send({ scope: { kind: 'series', seriesIds: [feederId] } });
  expect(first.status).toBe(202);
  const started = await server.pool.query(`select target_id from audit_log where action = 'refit.started'`);
  expect(started.rows).toEqual([{ target_id: String(first.body.id) }]);

  // An import waiting in the queue, and a person whose invite is still pending.
  const posted = await postFile(server.url, admin, 'feeder.csv', 'timestamp,load_kw\n2026-01-01T00:00:00Z,812\n2026-01-01T01:00:00Z,798\n');
  const uploadId = posted.body.upload.id as number;
  const mapping = {
    layout: 'long',
    timestampColumn: 'timestamp',
    valueColumn: 'load_kw',
    seriesKeyColumn: null,
    seriesKey: 'tv-f301',
  } as const;
  const settings = {
    unit: 'kW',
    timeZone: 'UTC',
    timestampsMark: 'start',
    repeatedHourPolicy: 'by-order',
    decimalSeparator: '.',
    estimateShortGaps: true,
  } as const;
  expect((await confirm(server.url, admin, uploadId, { mapping, settings })).body.status).toBe('queued');
  const invited = await request(server.url)
    .post('/api/people')
    .set(asAdmin())
    .send({ email: 'new.planner@test.example', displayName: 'New Planner', role: 'planner' });
  expect(invited.status).toBe(201);

  await server.pool.query(`
    create function refuse_audit() returns trigger language plpgsql as $$ begin raise exception 'audit log refuses writes'; end $$;
    create trigger refuse_audit before insert on audit_log for each row execute function refuse_audit();`);
  const before = await rowCounts();
  const queued = await uploadState(uploadId);
  expect(queued.status).toBe('queued');

  const refit = await request(server.url)
    .post('/api/refits')
    .set(asAdmin())
    .send({ scope: { kind: 'series', seriesIds: [feederId] } });
  const cancel = await request(server.url).post(`/api/uploads/${uploadId}/cancel`).set(asAdmin());
  const resend = await request(server.url).post(`/api/people/${invited.body.id}/invite`).set(asAdmin());
  expect([refit.status, cancel.status, resend.status]).toEqual([500, 500, 500]);

  // No run, run series or refit job; the upload still queued with its file; no new link, mail or mail job.
  expect(await rowCounts()).toEqual(before);
  expect(await uploadState(uploadId)).toEqual(queued);
  expect(existsSync(queued.storage_path!)).toBe(true);

  // With the audit log writable again, each action happens together with its entry.
  await server.pool.query('drop trigger refuse_audit on audit_log');
  const again = [
    await request(server.url)
      .post('/api/refits')
      .set(asAdmin())
      .send({ scope: { kind: 'series', seriesIds: [feederId] } }),
    await request(server.url).post(`/api/uploads/${uploadId}/cancel`).set(asAdmin()),
    await request(server.url).post(`/api/people/${invited.body.id}/invite`).set(asAdmin()),
  ];
  expect(again.map((response) => response.status)).toEqual([202, 200, 200]);
  const { rows: entries } = await server.pool.query<{ action: string; target_id: string }>(
    `select action, target_id from audit_log where action in ('refit.started', 'upload.cancelled', 'user.invite_resent') order by id`,
  );
  expect(entries).toEqual([
    { action: 'refit.started', target_id: String(first.body.id) },
    { action: 'refit.started', target_id: String(again[0]!.body.id) },
    { action: 'upload.cancelled', target_id: String(uploadId) },
    { action: 'user.invite_resent', target_id: String(invited.body.id) },
  ]);
  expect(existsSync(queued.storage_path!)).toBe(false);
});
