/**
 * API tokens act for their creator, refused calls and Outbox reads reach the audit log without
 * flooding it, and answers that name people, tokens, sessions, mail or audit entries are never cached.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listCaughtMail } from '@loadwright/mail';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;
let people: Awaited<ReturnType<typeof createPeople>>;
let admin: SignedIn;

beforeAll(async () => {
  server = await startTestServer(); // with a worker: mail goes out through the send-mail job
  people = await createPeople(server.db);
  admin = await signIn(server.url, people.admin.email);
});
afterAll(() => server.close());

const asAdmin = () => ({ Cookie: admin.cookie.join('; '), 'X-CSRF-Token': admin.csrf });

/** Creates a token through the API as the signed-in person; returns its id and secret. */
async function createToken(by: SignedIn, scope: 'read' | 'read-write', name: string): Promise<{ id: number; secret: string }> {
  const response = await request(server.url)
    .post('/api/tokens')
    .set({ Cookie: by.cookie.join('; '), 'X-CSRF-Token': by.csrf })
    .send({ name, scope, expiresInDays: 30 });
  expect(response.status).toBe(201);
  return { id: response.body.token.id, secret: response.body.secret };
}

/** Audit entries of one action, oldest first. */
async function audited(action: string) {
  const { rows } = await server.pool.query<{
    actor_user_id: number | null;
    actor_token_id: number | null;
    target_id: string | null;
    detail: Record<string, unknown>;
  }>(`SELECT actor_user_id, actor_token_id, target_id, detail FROM audit_log WHERE action = $1 ORDER BY id`, [action]);
  return rows;
}

describe('API tokens', () => {
  it('act with at most their creator’s current rights, and stop when the creator is deactivated', async () => {
    const makers = await createPeople(server.db, '-maker');
    const maker = await signIn(server.url, makers.admin.email);
    const token = await createToken(maker, 'read-write', 'Dispatch feed');
    const bearer = { Authorization: `Bearer ${token.secret}` };
    // As made: an admin's read-write token may upload (the empty upload is refused for its missing file, not for rights).
    expect((await request(server.url).post('/api/uploads').set(bearer)).status).toBe(400);
    expect((await request(server.url).get('/api/series').set(bearer)).status).toBe(200);

    await request(server.url).patch(`/api/people/${makers.admin.id}`).set(asAdmin()).send({ role: 'viewer' }).expect(200);
    const demoted = await request(server.url).post('/api/uploads').set(bearer);
    expect(demoted.status).toBe(403);
    expect(demoted.body.detail).toBe(
      'This token acts for its creator, whose viewer role does not have the "data.upload" permission. Ask an administrator for a new token.',
    );
    expect((await request(server.url).get('/api/series').set(bearer)).status).toBe(200); // viewers read data

    await request(server.url).patch(`/api/people/${makers.admin.id}`).set(asAdmin()).send({ active: false }).expect(200);
    const stopped = await request(server.url).get('/api/series').set(bearer);
    expect(stopped.status).toBe(401);
    expect(stopped.body.detail).toBe('The API token stopped working because the person who created it is no longer active.');
    expect((await audited('token.refused')).filter((e) => e.target_id === String(token.id))).toEqual([
      {
        actor_user_id: null,
        actor_token_id: null,
        target_id: String(token.id),
        detail: expect.objectContaining({ cause: 'creator inactive', status: 401 }),
      },
    ]);
  });
});

describe('the audit log', () => {
  it('records use of a revoked or an expired token once per token and cause, folding the repeats', async () => {
    const revoked = await createToken(admin, 'read', 'Old dashboard');
    const expired = await createToken(admin, 'read', 'Trial feed');
    await request(server.url).delete(`/api/tokens/${revoked.id}`).set(asAdmin()).expect(204);
    await server.pool.query(`UPDATE api_tokens SET expires_at = now() - interval '1 second' WHERE id = $1`, [expired.id]);
    for (let i = 0; i < 5; i++) {
      expect((await request(server.url).get('/api/series').set('Authorization', `Bearer ${revoked.secret}`)).status).toBe(401);
      expect((await request(server.url).get('/api/series').set('Authorization', `Bearer ${expired.secret}`)).status).toBe(401);
    }
    const entries = await audited('token.refused');
    expect(entries.filter((e) => e.target_id === String(revoked.id)).map((e) => e.detail)).toEqual([
      { cause: 'revoked', route: 'GET /api/series', status: 401, visitor: true },
    ]);
    expect(entries.filter((e) => e.target_id === String(expired.id)).map((e) => e.detail)).toEqual([
      { cause: 'expired', route: 'GET /api/series', status: 401, visitor: true },
    ]);
  });

  it('records a person refused for their role, and a write without its CSRF token, once each in ten minutes', async () => {
    const viewer = await signIn(server.url, people.viewer.email);
    for (let i = 0; i < 3; i++) expect((await request(server.url).get('/api/people').set('Cookie', viewer.cookie)).status).toBe(403);
    expect(await audited('access.denied')).toContainEqual({
      actor_user_id: people.viewer.id,
      actor_token_id: null,
      target_id: null,
      detail: {
        route: 'GET /api/people',
        status: 403,
        reason: 'The viewer role does not have the "admin.people" permission. Ask an administrator if you need it.',
      },
    });
    expect((await audited('access.denied')).filter((e) => e.actor_user_id === people.viewer.id)).toHaveLength(1);
    for (let i = 0; i < 2; i++)
      expect(
        (await request(server.url).post('/api/tokens').set('Cookie', admin.cookie).send({ name: 'x', scope: 'read', expiresInDays: 1 }))
          .status,
      ).toBe(403);
    expect(await audited('access.csrf_refused')).toEqual([
      { actor_user_id: people.admin.id, actor_token_id: null, target_id: null, detail: { route: 'POST /api/tokens', status: 403 } },
    ]);
  });

  it('records an ended session used again, and not a visitor who presented nothing', async () => {
    const others = await createPeople(server.db, '-ended');
    const planner = await signIn(server.url, others.planner.email);
    await request(server.url)
      .post('/api/auth/sign-out')
      .set({ Cookie: planner.cookie.join('; '), 'X-CSRF-Token': planner.csrf })
      .expect(204);
    const before = (await audited('access.denied')).length;
    expect((await request(server.url).get('/api/auth/session')).status).toBe(401);
    expect((await audited('access.denied')).length).toBe(before);
    expect((await request(server.url).get('/api/auth/session').set('Cookie', planner.cookie)).status).toBe(401);
    expect((await audited('access.denied')).slice(before).map((e) => e.detail)).toEqual([
      { cause: 'session ended', route: 'GET /api/auth/session', status: 401, visitor: true },
    ]);
  });

  it('records who read which Outbox message, and the list, without an entry per poll', async () => {
    await request(server.url).post('/api/auth/forgot-password').send({ email: people.planner.email }).expect(200);
    let mail = listCaughtMail(server.outboxFolder);
    for (let i = 0; i < 150 && mail.length === 0; i++) {
      await new Promise((r) => setTimeout(r, 100));
      mail = listCaughtMail(server.outboxFolder);
    }
    const message = mail[0]!;
    for (let i = 0; i < 3; i++) {
      await request(server.url).get('/api/outbox').set('Cookie', admin.cookie).expect(200);
      await request(server.url).get(`/api/outbox/${message.id}`).set('Cookie', admin.cookie).expect(200);
    }
    expect(await audited('outbox.message_read')).toEqual([
      { actor_user_id: people.admin.id, actor_token_id: null, target_id: message.id, detail: { subject: message.subject, to: message.to } },
    ]);
    expect(await audited('outbox.listed')).toEqual([
      { actor_user_id: people.admin.id, actor_token_id: null, target_id: null, detail: { messages: mail.length } },
    ]);
  });
});

describe('caching', () => {
  it('forbids storing answers that carry people, tokens, sessions, mail or audit entries, errors included', async () => {
    const responses = [
      await request(server.url).post('/api/auth/sign-in').send({ email: people.steward.email, password: 'correct horse battery staple' }),
      await request(server.url).get('/api/auth/session').set('Cookie', admin.cookie),
      await request(server.url).get('/api/people').set('Cookie', admin.cookie),
      await request(server.url).get('/api/tokens').set('Cookie', admin.cookie),
      await request(server.url).post('/api/tokens').set(asAdmin()).send({ name: 'Cache check', scope: 'read', expiresInDays: 1 }),
      await request(server.url).get('/api/audit').set('Cookie', admin.cookie),
      await request(server.url).get('/api/outbox').set('Cookie', admin.cookie),
      await request(server.url).get('/api/outbox/no-such-message').set('Cookie', admin.cookie),
      await request(server.url).get('/api/people'),
    ];
    expect(responses.map((r) => r.status)).toEqual([200, 200, 200, 200, 201, 200, 200, 404, 401]);
    for (const response of responses) expect(response.headers['cache-control']).toBe('no-store');
  });
});
