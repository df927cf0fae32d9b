/**
 * No response body and no log line may carry a password, a password hash, an API token, a session
 * token or a one-time link secret. This drives every secret-handling flow and scans everything the
 * server said.
 */
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { listCaughtMail } from '@loadwright/mail';
import { createPeople, signIn, testPassword } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';

const logLines: string[] = [];
let server: TestServer;

beforeAll(async () => {
  server = await startTestServer({ logLines });
});
afterAll(() => server.close());

it('keeps passwords, hashes and tokens out of responses and logs', async () => {
  const people = await createPeople(server.db);
  const bodies: string[] = [];
  const keep = (response: request.Response) => {
    bodies.push(response.text ?? '', JSON.stringify(response.headers['location'] ?? ''));
    return response;
  };
  const secrets: string[] = [testPassword];

  keep(await request(server.url).post('/api/auth/sign-in').send({ email: people.viewer.email, password: 'a wrong password typed here' }));
  secrets.push('a wrong password typed here');
  const admin = await signIn(server.url, people.admin.email);
  secrets.push(...admin.cookie.map((c) => c.split('=')[1]!));
  const auth = { Cookie: admin.cookie.join('; '), 'X-CSRF-Token': admin.csrf };

  // The creation response is the one place a token secret is meant to appear (shown once), so it is not scanned.
  const created = await request(server.url).post('/api/tokens').set(auth).send({ name: 'Procurement', scope: 'read', expiresInDays: null });
  const tokenSecret = created.body.secret as string;
  expect(tokenSecret).toMatch(/^lw_/);
  keep(await request(server.url).get('/api/tokens').set(auth));
  keep(await request(server.url).get('/api/health').set('Authorization', `Bearer ${tokenSecret}`));

  keep(
    await request(server.url).post('/api/people').set(auth).send({ email: 'invitee@test.example', displayName: 'Invitee', role: 'viewer' }),
  );
  keep(await request(server.url).get('/api/people').set(auth));
  let mail = listCaughtMail(server.outboxFolder);
  for (let i = 0; i < 50 && mail.length === 0; i++) {
    await new Promise((r) => setTimeout(r, 100));
    mail = listCaughtMail(server.outboxFolder);
  }
  const linkSecret = decodeURIComponent(/token=([^\s"&]+)/.exec(mail[0]!.text)![1]!);
  const newPassword = 'invitee chose this long one';
  keep(
    await request(server.url)
      .post(`/api/auth/set-password?token=${encodeURIComponent(linkSecret)}`)
      .send({ token: linkSecret, newPassword }),
  );
  secrets.push(linkSecret, newPassword);
  keep(
    await request(server.url)
      .post('/api/auth/password')
      .set(auth)
      .send({ currentPassword: testPassword, newPassword: 'admin rotated password 9' }),
  );
  secrets.push('admin rotated password 9');
  keep(await request(server.url).get('/api/audit').set(auth));
  keep(await request(server.url).get('/api/outbox').set(auth));

  const { rows } = await server.pool.query<{ password_hash: string }>('SELECT password_hash FROM users WHERE password_hash IS NOT NULL');
  const hashes = rows.map((r) => r.password_hash);
  const everything = [...bodies, ...logLines].join('\n');
  expect(logLines.length).toBeGreaterThan(5);
  for (const secret of [...secrets, tokenSecret, ...hashes])
    expect(everything.includes(secret), `leaked: ${secret.slice(0, 12)}…`).toBe(false);
  expect(everything).not.toMatch(/\$argon2id\$/);
});
