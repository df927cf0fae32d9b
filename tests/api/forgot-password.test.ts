/**
 * "Forgot password" answers the same whether the address belongs to an active account, an inactive
 * one or nobody, and whatever happens to the mail: here the mail server refuses every connection.
 * The link, its audit entry and its queued mail are still written for the known address (mail goes
 * through the send-mail job, which retries until the server is back).
 */
import { createServer } from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createPeople } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;
let people: Awaited<ReturnType<typeof createPeople>>;
const logLines: string[] = [];

/** A loopback port nothing listens on (taken, then released). */
async function closedPort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((done) => probe.listen(0, '127.0.0.1', done));
  const { port } = probe.address() as { port: number };
  await new Promise<void>((done) => probe.close(() => done()));
  return port;
}

beforeAll(async () => {
  server = await startTestServer({ worker: false, logLines, smtpUrl: `smtp://127.0.0.1:${await closedPort()}` });
  people = await createPeople(server.db);
  await server.pool.query(`UPDATE users SET active = false WHERE id = $1`, [people.viewer.id]);
});
afterAll(() => server.close());

it('gives one answer for a known, an inactive and an unknown address while the mail server is down', async () => {
  const answers = [];
  for (const email of [people.planner.email, people.viewer.email, 'nobody@test.example', people.planner.email]) {
    const response = await request(server.url).post('/api/auth/forgot-password').send({ email });
    answers.push({ status: response.status, type: response.headers['content-type'], body: response.body });
  }
  expect(answers[0]).toEqual({
    status: 200,
    type: expect.stringMatching(/^application\/json/),
    body: { message: 'If that address belongs to an active account, a reset link is on its way. It expires in 30 minutes.' },
  });
  for (const answer of answers.slice(1)) expect(answer).toEqual(answers[0]);
  // The known, active address got its link, audit entry and queued mail; nothing of the mail's fate reached the visitor.
  await expect
    .poll(
      async () =>
        (await server.pool.query(`SELECT count(*)::int AS n FROM one_time_tokens WHERE user_id = $1`, [people.planner.id])).rows[0].n,
    )
    .toBe(1);
  const queued = await server.pool.query(`SELECT recipient, status FROM mail_messages WHERE user_id = $1`, [people.planner.id]);
  expect(queued.rows).toEqual([{ recipient: people.planner.email, status: 'queued' }]);
  const { rows } = await server.pool.query(`SELECT target_id FROM audit_log WHERE action = 'user.password_reset_requested'`);
  expect(rows).toEqual([{ target_id: String(people.planner.id) }]);
});
