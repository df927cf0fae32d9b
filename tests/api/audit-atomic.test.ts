/**
 * A change and its audit entry are committed together or not at all. The database is made to refuse
 * every audit insert (a trigger, the way a full disk or a bad value would fail it); each route that
 * creates, revokes or removes something must then fail without leaving the thing changed, and the log
 * must say what failed without the statement's parameters (token hashes, e-mail addresses).
 */
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;
let admin: SignedIn;
let people: Awaited<ReturnType<typeof createPeople>>;
const logLines: string[] = [];

beforeAll(async () => {
  server = await startTestServer({ worker: false, logLines });
  people = await createPeople(server.db);
  admin = await signIn(server.url, people.admin.email);
});
afterAll(() => server.close());

/** Rows per table of the product. */
async function rowCounts(): Promise<Record<string, number>> {
  const { rows: tables } = await server.pool.query<{ name: string }>(
    `select table_name as name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE'`,
  );
  const { rows } = await server.pool.query<{ name: string; count: number }>(
    tables.map((t) => `select '${t.name}' as name, count(*)::int as count from "${t.name}"`).join(' union all '),
  );
  return Object.fromEntries(rows.map((r) => [r.name, r.count]));
}

it('leaves nothing half-written when the audit entry cannot be stored', async () => {
  const headers = { Cookie: admin.cookie.join('; '), 'X-CSRF-Token': admin.csrf };
  // Things to revoke and remove, made while the audit log still takes entries.
  const token = await request(server.url).post('/api/tokens').set(headers).send({ name: 'To revoke', scope: 'read', expiresInDays: 1 });
  const holiday = await request(server.url).post('/api/holidays').set(headers).send({ day: '2026-07-03', name: 'Plant shutdown' });
  expect([token.status, holiday.status]).toEqual([201, 201]);
  const csv = Buffer.from('ts,value\n2026-01-01T00:00:00Z,1\n2026-01-01T01:00:00Z,2\n');
  const upload = await request(server.url).post('/api/uploads').set(headers).attach('file', csv, 'feeder.csv');
  expect(upload.status).toBe(201);
  const planner = await signIn(server.url, people.planner.email);

  await server.pool.query(`
    create function refuse_audit() returns trigger language plpgsql as $$ begin raise exception 'audit log refuses writes'; end $$;
    create trigger refuse_audit before insert on audit_log for each row execute function refuse_audit();`);
  const before = await rowCounts();
  const calls = [
    request(server.url).post('/api/tokens').set(headers).send({ name: 'Never stored', scope: 'read-write', expiresInDays: null }),
    request(server.url).delete(`/api/tokens/${token.body.token.id}`).set(headers),
    request(server.url)
      .post('/api/people')
      .set(headers)
      .send({ email: 'never.invited@test.example', displayName: 'Never', role: 'viewer' }),
    request(server.url).post('/api/holidays').set(headers).send({ day: '2026-12-24', name: 'Never added' }),
    request(server.url).delete(`/api/holidays/${holiday.body.id}`).set(headers),
    request(server.url).post('/api/uploads').set(headers).attach('file', Buffer.from('ts,value\n2026-02-01T00:00:00Z,3\n'), 'other.csv'),
    request(server.url).delete(`/api/uploads/${upload.body.upload.id}`).set(headers),
    request(server.url).post('/api/auth/sign-in').send({ email: people.steward.email, password: 'correct horse battery staple' }),
    request(server.url)
      .post('/api/auth/sign-out')
      .set({ Cookie: planner.cookie.join('; '), 'X-CSRF-Token': planner.csrf }),
  ];
  const statuses = [];
  for (const call of calls) statuses.push((await call).status);
  expect(statuses).toEqual([500, 500, 500, 500, 500, 500, 500, 500, 500]);
  expect(await rowCounts()).toEqual(before);
  const { rows } = await server.pool.query(`select revoked_at from api_tokens where id = $1`, [token.body.token.id]);
  expect(rows).toEqual([{ revoked_at: null }]);
  // The planner's session was not ended without its entry either.
  expect((await request(server.url).get('/api/auth/session').set('Cookie', planner.cookie)).status).toBe(200);

  // The log names the failure and the statement, never its values.
  const errors = logLines.filter((line) => line.includes('unhandled error'));
  expect(errors.length).toBe(9);
  expect(errors.join('\n')).toContain('audit log refuses writes');
  const { rows: hashes } = await server.pool.query<{ secret_hash: string }>(`select secret_hash from api_tokens`);
  for (const line of logLines) {
    expect(line).not.toContain('never.invited@test.example');
    expect(line).not.toContain('Never stored');
    for (const { secret_hash } of hashes) expect(line).not.toContain(secret_hash);
    expect(line).not.toMatch(/params:/);
  }
});
