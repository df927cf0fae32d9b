/** Sign-in, sessions, CSRF, lockout, passwords and one-time links, through the real API and PostgreSQL. */
import { eq } from 'drizzle-orm';
import { sessions } from '@loadwright/db';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listCaughtMail } from '@loadwright/mail';
import { createPeople, signIn, testPassword } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;
let people: Awaited<ReturnType<typeof createPeople>>;

beforeAll(async () => {
  server = await startTestServer();
  people = await createPeople(server.db);
});
afterAll(() => server.close());

/** Waits for the catcher to have a message to `to` whose subject contains `subject`. */
async function mailTo(to: string, subject: string) {
  for (let i = 0; i < 50; i++) {
    const mail = listCaughtMail(server.outboxFolder).find((m) => m.to.includes(to) && m.subject.includes(subject));
    if (mail) return mail;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${to} about ${subject}`);
}

describe('sign-in', () => {
  it('sets an httpOnly SameSite=Strict session cookie and a readable CSRF cookie', async () => {
    const response = await request(server.url).post('/api/auth/sign-in').send({ email: people.planner.email, password: testPassword });
    expect(response.status).toBe(200);
    expect(response.body.user).toMatchObject({ email: people.planner.email, role: 'planner' });
    expect(response.body.permissions).toContain('forecasts.approve');
    expect(response.body.permissions).not.toContain('admin.people');
    const cookies = ([] as string[]).concat(response.headers['set-cookie']);
    const session = cookies.find((c) => c.startsWith('lw_session='))!;
    expect(session).toMatch(/HttpOnly/);
    expect(session).toMatch(/SameSite=Strict/);
    expect(cookies.find((c) => c.startsWith('lw_csrf='))).not.toMatch(/HttpOnly/);
  });

  it('accepts the e-mail in any letter case', async () => {
    const response = await request(server.url)
      .post('/api/auth/sign-in')
      .send({ email: people.viewer.email.toUpperCase(), password: testPassword });
    expect(response.status).toBe(200);
  });

  it('gives the same answer for an unknown e-mail and a wrong password', async () => {
    const unknown = await request(server.url).post('/api/auth/sign-in').send({ email: 'nobody@test.example', password: testPassword });
    const wrong = await request(server.url).post('/api/auth/sign-in').send({ email: people.viewer.email, password: 'not the password' });
    expect(unknown.status).toBe(401);
    expect(wrong.status).toBe(401);
    expect(unknown.body.detail).toBe(wrong.body.detail);
    expect(unknown.headers['content-type']).toMatch(/application\/problem\+json/);
  });

  it('records failed sign-ins in the audit log as coming from a visitor, with the e-mail tried', async () => {
    const admin = await signIn(server.url, people.admin.email);
    const page = await request(server.url).get('/api/audit?action=session.sign_in_failed').set('Cookie', admin.cookie);
    expect(page.status).toBe(200);
    const entry = page.body.entries.find((e: { detail: { email?: string } }) => e.detail.email === 'nobody@test.example');
    expect(entry.actor).toEqual({ kind: 'visitor', id: null, name: null });
    expect(entry.ip).toMatch(/127\.0\.0\.1/);
  });

  it('makes an account wait longer after each failure past three, up to a minute, saying how long in words and Retry-After', async () => {
    const email = people.steward.email;
    // Each failure from its own address, so only the account's count rises (addresses have their own).
    const fail = (i: number) =>
      request(server.url)
        .post('/api/auth/sign-in')
        .set('X-Forwarded-For', `198.51.100.${i}`)
        .send({ email, password: `wrong ${i}` });
    const delays: (number | null)[] = [];
    for (let i = 1; i <= 10; i++) {
      expect((await fail(i)).status).toBe(401);
      const { rows } = await server.pool.query<{ delay: number | null }>(
        `SELECT extract(epoch FROM locked_until - updated_at)::float8 AS delay FROM login_throttles WHERE subject_kind = 'account' AND subject = $1`,
        [email],
      );
      delays.push(rows[0]!.delay === null ? null : Math.round(rows[0]!.delay));
      // Let the wait pass, as the clock would, before the next try.
      await server.pool.query(`UPDATE login_throttles SET locked_until = now() WHERE subject = $1 AND locked_until IS NOT NULL`, [email]);
    }
    // sign-in-throttle.ts: 3 free failures, then 1 × 2^(n−4) s, at most 60 s: 1, 2, 4, 8, 16, 32, then 64 capped at 60.
    expect(delays).toEqual([null, null, null, 1, 2, 4, 8, 16, 32, 60]);
    expect((await fail(11)).status).toBe(401); // the 11th failure waits 60 s again
    const waiting = await request(server.url).post('/api/auth/sign-in').send({ email, password: testPassword });
    expect(waiting.status).toBe(429);
    const retryAfter = Number(waiting.headers['retry-after']);
    expect(retryAfter).toBeGreaterThanOrEqual(1);
    expect(retryAfter).toBeLessThanOrEqual(60);
    expect(waiting.body.detail).toBe(`Too many failed sign-ins. Try again in ${retryAfter} seconds, or reset your password.`);
    expect(waiting.body.detail).not.toMatch(/password is|e-mail is/i);
  });

  it('lets nobody hold an account for more than a minute, and makes one address guessing at many accounts wait longer', async () => {
    const others = await createPeople(server.db, '-throttle');
    const address = '203.0.113.9';
    const attempt = (email: string, password = 'a wrong guess') =>
      request(server.url).post('/api/auth/sign-in').set('X-Forwarded-For', address).send({ email, password });
    // Ten free failures per address (three per account): spread over four accounts, none of them waits yet.
    const accounts = [others.admin.email, others.steward.email, others.planner.email, others.viewer.email];
    for (let i = 0; i < 10; i++) expect((await attempt(accounts[i % 4]!)).status).toBe(401);
    expect((await attempt(accounts[2]!)).status).toBe(401); // the 11th failure from the address starts its wait
    const fromThatAddress = await attempt(accounts[3]!, testPassword);
    expect(fromThatAddress.status).toBe(429);
    // The same right password from another address goes through: the address waits, the person does not.
    expect(
      (
        await request(server.url)
          .post('/api/auth/sign-in')
          .set('X-Forwarded-For', '203.0.113.10')
          .send({ email: accounts[3], password: testPassword })
      ).status,
    ).toBe(200);
    // However many failures an account gathers, its wait never exceeds the 60 s ceiling (the old rule locked it for 15 minutes after 5).
    const { rows } = await server.pool.query<{ seconds: number }>(
      `SELECT extract(epoch FROM max(locked_until) - now())::float8 AS seconds FROM login_throttles WHERE subject_kind = 'account'`,
    );
    expect(rows[0]!.seconds).toBeLessThanOrEqual(60);
  });

  it('lifts the wait when the person resets the password through the e-mailed link', async () => {
    const others = await createPeople(server.db, '-reset-lock');
    const email = others.planner.email;
    for (let i = 1; i <= 9; i++) {
      await request(server.url)
        .post('/api/auth/sign-in')
        .set('X-Forwarded-For', `192.0.2.${i}`)
        .send({ email, password: `wrong ${i}` });
      await server.pool.query(`UPDATE login_throttles SET locked_until = now() WHERE subject = $1 AND locked_until IS NOT NULL`, [email]);
    }
    await request(server.url).post('/api/auth/sign-in').set('X-Forwarded-For', '192.0.2.10').send({ email, password: 'wrong 10' });
    expect((await request(server.url).post('/api/auth/sign-in').send({ email, password: testPassword })).status).toBe(429);
    await request(server.url).post('/api/auth/forgot-password').send({ email }).expect(200);
    const mail = await mailTo(email, 'Reset');
    const token = decodeURIComponent(/token=([^\s"&]+)/.exec(mail.text)![1]!);
    const newPassword = 'a new password after the wait';
    expect((await request(server.url).post('/api/auth/set-password').send({ token, newPassword })).status).toBe(200);
    expect((await request(server.url).post('/api/auth/sign-in').send({ email, password: newPassword })).status).toBe(200);
  });

  it('refuses a write without the CSRF token, and accepts it with the token', async () => {
    const browser = await signIn(server.url, people.admin.email);
    const without = await request(server.url)
      .post('/api/tokens')
      .set('Cookie', browser.cookie)
      .send({ name: 'Dispatch', scope: 'read', expiresInDays: 30 });
    expect(without.status).toBe(403);
    expect(without.body.detail).toMatch(/CSRF/);
    const forged = await request(server.url)
      .post('/api/tokens')
      .set('Cookie', browser.cookie)
      .set('X-CSRF-Token', 'forged-value')
      .send({ name: 'Dispatch', scope: 'read', expiresInDays: 30 });
    expect(forged.status).toBe(403);
    const withToken = await request(server.url)
      .post('/api/tokens')
      .set('Cookie', browser.cookie)
      .set('X-CSRF-Token', browser.csrf)
      .send({ name: 'Dispatch', scope: 'read', expiresInDays: 30 });
    expect(withToken.status).toBe(201);
  });

  it('ends the session at once on sign-out', async () => {
    const browser = await signIn(server.url, people.viewer.email);
    expect((await request(server.url).get('/api/auth/session').set('Cookie', browser.cookie)).status).toBe(200);
    expect(
      (await request(server.url).post('/api/auth/sign-out').set('Cookie', browser.cookie).set('X-CSRF-Token', browser.csrf)).status,
    ).toBe(204);
    expect((await request(server.url).get('/api/auth/session').set('Cookie', browser.cookie)).status).toBe(401);
  });

  it('ends sessions at once when an admin changes the role or deactivates', async () => {
    const others = await createPeople(server.db, '-roles');
    const admin = await signIn(server.url, people.admin.email);
    const viewer = await signIn(server.url, others.viewer.email);
    const promote = await request(server.url)
      .patch(`/api/people/${others.viewer.id}`)
      .set('Cookie', admin.cookie)
      .set('X-CSRF-Token', admin.csrf)
      .send({ role: 'planner' });
    expect(promote.status).toBe(200);
    expect((await request(server.url).get('/api/auth/session').set('Cookie', viewer.cookie)).status).toBe(401);
    const again = await signIn(server.url, others.viewer.email);
    expect((await request(server.url).get('/api/auth/session').set('Cookie', again.cookie)).body.user.role).toBe('planner');
    await request(server.url)
      .patch(`/api/people/${others.viewer.id}`)
      .set('Cookie', admin.cookie)
      .set('X-CSRF-Token', admin.csrf)
      .send({ active: false })
      .expect(200);
    expect((await request(server.url).get('/api/auth/session').set('Cookie', again.cookie)).status).toBe(401);
    expect((await request(server.url).post('/api/auth/sign-in').send({ email: others.viewer.email, password: testPassword })).status).toBe(
      401,
    );
  });

  it('keeps the last active admin', async () => {
    await server.pool.query(`UPDATE users SET active = false WHERE role = 'admin' AND id <> $1`, [people.admin.id]);
    const admin = await signIn(server.url, people.admin.email);
    const response = await request(server.url)
      .patch(`/api/people/${people.admin.id}`)
      .set('Cookie', admin.cookie)
      .set('X-CSRF-Token', admin.csrf)
      .send({ role: 'viewer' });
    expect(response.status).toBe(409);
    expect(response.body.detail).toMatch(/last active admin/);
    const deactivate = await request(server.url)
      .patch(`/api/people/${people.admin.id}`)
      .set('Cookie', admin.cookie)
      .set('X-CSRF-Token', admin.csrf)
      .send({ active: false });
    expect(deactivate.status).toBe(409);
  });
});

describe('invites and password resets', () => {
  it('invites by e-mail with a single-use link that sets the password', async () => {
    const admin = await signIn(server.url, people.admin.email);
    const invite = await request(server.url)
      .post('/api/people')
      .set('Cookie', admin.cookie)
      .set('X-CSRF-Token', admin.csrf)
      .send({ email: 'new.planner@test.example', displayName: 'New Planner', role: 'planner' });
    expect(invite.status).toBe(201);
    expect(invite.body.invitePending).toBe(true);
    const mail = await mailTo('new.planner@test.example', 'invitation');
    expect(mail.text).toContain('/set-password?token=');
    expect(mail.html).toContain('Choose a password');
    const token = decodeURIComponent(/token=([^\s"&]+)/.exec(mail.text)![1]!);
    const newPassword = 'a fresh long password 42';
    expect((await request(server.url).post('/api/auth/set-password').send({ token, newPassword })).status).toBe(200);
    expect(
      (await request(server.url).post('/api/auth/sign-in').send({ email: 'new.planner@test.example', password: newPassword })).status,
    ).toBe(200);
    const reuse = await request(server.url).post('/api/auth/set-password').send({ token, newPassword: 'another long password' });
    expect(reuse.status).toBe(400);
    expect(reuse.body.detail).toMatch(/expired or was already used/);
  });

  it('resets a forgotten password by e-mail, and refuses an expired link', async () => {
    const answerKnown = await request(server.url).post('/api/auth/forgot-password').send({ email: people.planner.email });
    const answerUnknown = await request(server.url).post('/api/auth/forgot-password').send({ email: 'nobody@test.example' });
    expect(answerKnown.body).toEqual(answerUnknown.body);
    const mail = await mailTo(people.planner.email, 'Reset');
    const token = decodeURIComponent(/token=([^\s"&]+)/.exec(mail.text)![1]!);
    await server.pool.query(`UPDATE one_time_tokens SET expires_at = now() - interval '1 minute' WHERE used_at IS NULL`);
    const expired = await request(server.url).post('/api/auth/set-password').send({ token, newPassword: 'an expired attempt here' });
    expect(expired.status).toBe(400);
  });

  it("changes one's own password and ends the other sessions", async () => {
    const others = await createPeople(server.db, '-pw');
    const first = await signIn(server.url, others.steward.email);
    const second = await signIn(server.url, others.steward.email);
    const wrong = await request(server.url)
      .post('/api/auth/password')
      .set('Cookie', first.cookie)
      .set('X-CSRF-Token', first.csrf)
      .send({ currentPassword: 'nope', newPassword: 'brand new password 1' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.errors[0].pointer).toBe('/currentPassword');
    const ok = await request(server.url)
      .post('/api/auth/password')
      .set('Cookie', first.cookie)
      .set('X-CSRF-Token', first.csrf)
      .send({ currentPassword: testPassword, newPassword: 'brand new password 1' });
    expect(ok.status).toBe(200);
    expect((await request(server.url).get('/api/auth/session').set('Cookie', first.cookie)).status).toBe(200);
    expect((await request(server.url).get('/api/auth/session').set('Cookie', second.cookie)).status).toBe(401);
    const rows = await server.db.select().from(sessions).where(eq(sessions.userId, others.steward.id));
    expect(rows.filter((r) => r.revokedAt === null)).toHaveLength(1);
  });
});
