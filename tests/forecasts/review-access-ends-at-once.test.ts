/**
 * The forecast review is the API's busiest answer and is sent from stored bytes, but who may read it
 * is decided afresh on every request: a token stops the moment it is revoked, expires or its creator
 * is deactivated, and a session the moment its person signs out, is deactivated or changes role. Each
 * case first reads the review many times at once (every pooled connection, the stored review and any
 * per-connection statement warmed), then ends the credential and reads again at once, with and
 * without the review's ETag: the answer must be 401, never the stored review nor a 304.
 */
import { series } from '@loadwright/db';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { writeDraftVersion } from './support/draft-versions';

let server: TestServer;
let people: Awaited<ReturnType<typeof createPeople>>;
let admin: SignedIn;
let path: string;
let etag: string;
const hourMs = 3_600_000;

const asAdmin = () => ({ Cookie: admin.cookie.join('; '), 'X-CSRF-Token': admin.csrf });

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  people = await createPeople(server.db);
  admin = await signIn(server.url, people.admin.email);
  const [feeder] = await server.db
    .insert(series)
    .values({ key: 'tv-f401', name: 'Tallowmere F401', kind: 'load', level: 'feeder', unit: 'kW', intervalMinutes: 60, timeZone: 'UTC' })
    .returning({ id: series.id });
  await writeDraftVersion(server.db, { seriesId: feeder!.id, origin: new Date(Math.floor(Date.now() / hourMs) * hourMs) });
  path = `/api/series/${feeder!.id}/forecast`;
  const first = await request(server.url).get(path).set('Cookie', admin.cookie);
  expect(first.status).toBe(200);
  etag = first.headers['etag'] as string;
  expect(etag).toMatch(/^"[\w-]+"$/);
});
afterAll(() => server.close());

/** Reads the review 30 times at once with these headers; every answer's status. */
async function burst(headers: Record<string, string>): Promise<number[]> {
  const answers = await Promise.all(Array.from({ length: 30 }, () => request(server.url).get(path).set(headers)));
  return [...new Set(answers.map((answer) => answer.status))];
}

/** The review read right after a credential ended: plainly, and as a revalidation with the current ETag. */
async function readAfterEnd(headers: Record<string, string>) {
  const plain = await request(server.url).get(path).set(headers);
  const revalidated = await request(server.url)
    .get(path)
    .set({ ...headers, 'If-None-Match': etag });
  return { statuses: [plain.status, revalidated.status], body: plain.body as { draft?: unknown; detail?: string } };
}

/** Creates a read token as the given admin; its secret as a bearer header, and its id. */
async function readToken(by: SignedIn, name: string) {
  const response = await request(server.url)
    .post('/api/tokens')
    .set({ Cookie: by.cookie.join('; '), 'X-CSRF-Token': by.csrf })
    .send({ name, scope: 'read', expiresInDays: 30 });
  expect(response.status).toBe(201);
  return { id: response.body.token.id as number, bearer: { Authorization: `Bearer ${response.body.secret as string}` } };
}

describe('an API token reading the review', () => {
  it('stops at once when it is revoked', async () => {
    const token = await readToken(admin, 'Dispatch desk');
    expect(await burst(token.bearer)).toEqual([200]);
    await request(server.url).delete(`/api/tokens/${token.id}`).set(asAdmin()).expect(204);
    const after = await readAfterEnd(token.bearer);
    expect(after.statuses).toEqual([401, 401]);
    expect(after.body.draft).toBeUndefined();
  });

  it('stops at once when it expires', async () => {
    const token = await readToken(admin, 'Short-lived feed');
    await server.pool.query(`update api_tokens set expires_at = now() + interval '1.5 seconds' where id = $1`, [token.id]);
    expect(await burst(token.bearer)).toEqual([200]);
    await new Promise((resolve) => setTimeout(resolve, 1_600));
    expect((await readAfterEnd(token.bearer)).statuses).toEqual([401, 401]);
  });

  it('stops at once when its creator is deactivated', async () => {
    const makers = await createPeople(server.db, '-maker');
    const maker = await signIn(server.url, makers.admin.email);
    const token = await readToken(maker, 'Maker’s feed');
    expect(await burst(token.bearer)).toEqual([200]);
    await request(server.url).patch(`/api/people/${makers.admin.id}`).set(asAdmin()).send({ active: false }).expect(200);
    const after = await readAfterEnd(token.bearer);
    expect(after.statuses).toEqual([401, 401]);
    expect(after.body.detail).toBe('The API token stopped working because the person who created it is no longer active.');
  });
});

describe('a signed-in person reading the review', () => {
  it('is refused at once after signing out', async () => {
    const planner = await signIn(server.url, people.planner.email);
    expect(await burst({ Cookie: planner.cookie.join('; ') })).toEqual([200]);
    await request(server.url)
      .post('/api/auth/sign-out')
      .set({ Cookie: planner.cookie.join('; '), 'X-CSRF-Token': planner.csrf })
      .expect(204);
    expect((await readAfterEnd({ Cookie: planner.cookie.join('; ') })).statuses).toEqual([401, 401]);
  });

  it('is refused at once after being deactivated or given another role', async () => {
    const others = await createPeople(server.db, '-others');
    const viewer = await signIn(server.url, others.viewer.email);
    const steward = await signIn(server.url, others.steward.email);
    expect(await burst({ Cookie: viewer.cookie.join('; ') })).toEqual([200]);
    expect(await burst({ Cookie: steward.cookie.join('; ') })).toEqual([200]);
    await request(server.url).patch(`/api/people/${others.viewer.id}`).set(asAdmin()).send({ active: false }).expect(200);
    await request(server.url).patch(`/api/people/${others.steward.id}`).set(asAdmin()).send({ role: 'planner' }).expect(200);
    expect((await readAfterEnd({ Cookie: viewer.cookie.join('; ') })).statuses).toEqual([401, 401]);
    expect((await readAfterEnd({ Cookie: steward.cookie.join('; ') })).statuses).toEqual([401, 401]);
  });
});
