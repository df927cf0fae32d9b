/**
 * All product mail goes through the 'send-mail' job: with the mail server down an invitation still
 * succeeds, says the mail is delayed, and the mail waits in the sent-mail log; once the server is
 * back the mail arrives exactly once.
 */
import { eq } from 'drizzle-orm';
import { mailMessages, users } from '@loadwright/db';
import { listCaughtMail } from '@loadwright/mail';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;
let admin: SignedIn;

beforeAll(async () => {
  // One-second base delay so the retries (1–2 s, 2–4 s, 4–8 s …) fit in a test.
  process.env['MAIL_RETRY_DELAY_SECONDS'] = '1';
  server = await startTestServer();
  const people = await createPeople(server.db);
  admin = await signIn(server.url, people.admin.email);
});
afterAll(async () => {
  delete process.env['MAIL_RETRY_DELAY_SECONDS'];
  await server.close();
});

/** Polls `probe` every 200 ms until it returns a value, for up to `seconds`. */
async function eventually<T>(probe: () => Promise<T | undefined>, seconds: number, what: string): Promise<T> {
  for (let i = 0; i < seconds * 5; i++) {
    const value = await probe();
    if (value !== undefined) return value;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`timed out waiting for ${what}`);
}

const logRowTo = async (recipient: string) => (await server.db.select().from(mailMessages).where(eq(mailMessages.recipient, recipient)))[0];

describe('mail while the mail server is down', () => {
  it('queues an invitation, reports the delay, and delivers it exactly once when the server returns', async () => {
    await server.mailServer.stop();
    const auth = { Cookie: admin.cookie.join('; '), 'X-CSRF-Token': admin.csrf };

    const invite = await request(server.url)
      .post('/api/people')
      .set(auth)
      .send({ email: 'late@test.example', displayName: 'Late', role: 'viewer' });
    expect(invite.status).toBe(201);
    expect(invite.body).toMatchObject({ email: 'late@test.example', invitePending: true });
    expect(invite.body.mailNotice).toMatch(/^The invitation to late@test.example is/);

    // The first attempt fails against the closed port; the row stays queued with the reason.
    const failing = await eventually(
      async () => {
        const row = await logRowTo('late@test.example');
        return row && row.attempts >= 1 ? row : undefined;
      },
      15,
      'a failed first attempt',
    );
    expect(failing).toMatchObject({ kind: 'invite', status: 'queued', sentAt: null });
    expect(failing.lastError).toMatch(/ECONNREFUSED|connect/i);

    // A second invitation now says plainly that mail is delayed; the admin sees both queued in the log.
    const second = await request(server.url)
      .post('/api/people')
      .set(auth)
      .send({ email: 'later@test.example', displayName: 'Later', role: 'planner' });
    expect(second.status).toBe(201);
    expect(second.body.mailNotice).toMatch(/queued, but delayed/);
    const log = await request(server.url).get('/api/mail-log').set(auth);
    expect(log.status).toBe(200);
    expect(log.body.delayed).toBe(true);
    expect(log.body.delayNotice).toMatch(/has not accepted mail/);
    const queued = log.body.entries.filter((e: { status: string }) => e.status === 'queued').map((e: { recipient: string }) => e.recipient);
    expect(queued).toEqual(expect.arrayContaining(['late@test.example', 'later@test.example']));
    expect(listCaughtMail(server.outboxFolder)).toHaveLength(0);

    // The account exists once, and inviting again is refused as before (the mail is not lost, it waits).
    const again = await request(server.url)
      .post('/api/people')
      .set(auth)
      .send({ email: 'late@test.example', displayName: 'Late', role: 'viewer' });
    expect(again.status).toBe(409);
    expect(await server.db.select().from(users).where(eq(users.email, 'late@test.example'))).toHaveLength(1);

    await server.mailServer.start();
    const sent = await eventually(
      async () => {
        const rows = await Promise.all(['late@test.example', 'later@test.example'].map(logRowTo));
        return rows.every((row) => row?.status === 'sent') ? rows : undefined;
      },
      30,
      'both invitations sent',
    );
    // The first keeps the record of its failed attempt; it took at least two.
    expect(sent[0]!.attempts).toBeGreaterThanOrEqual(2);
    expect(sent[0]!.lastError).toMatch(/ECONNREFUSED|connect/i);

    // Exactly once each, even after further sweeps and polls have had their chance.
    await new Promise((r) => setTimeout(r, 3_000));
    const caught = listCaughtMail(server.outboxFolder);
    expect(caught.filter((m) => m.to.includes('late@test.example'))).toHaveLength(1);
    expect(caught.filter((m) => m.to.includes('later@test.example'))).toHaveLength(1);
    const late = caught.find((m) => m.to.includes('late@test.example'))!;
    expect(late.subject).toBe('Your Loadwright invitation');
    expect(late.text).toMatch(/set-password\?token=/);

    const after = await request(server.url).get('/api/mail-log').set(auth);
    expect(after.body.delayed).toBe(false);
    expect(after.body.entries.map((e: { status: string }) => e.status)).toEqual(['sent', 'sent']);
  });

  it('queues a password reset the same way and delivers it', async () => {
    const response = await request(server.url).post('/api/auth/forgot-password').send({ email: 'viewer@test.example' });
    expect(response.status).toBe(200);
    const row = await eventually(
      async () => {
        const found = await logRowTo('viewer@test.example');
        return found?.status === 'sent' ? found : undefined;
      },
      15,
      'the reset sent',
    );
    expect(row).toMatchObject({ kind: 'password_reset', attempts: 1, lastError: null });
    expect(listCaughtMail(server.outboxFolder).filter((m) => m.to.includes('viewer@test.example'))).toHaveLength(1);
  });

  it('refuses the sent-mail log to everyone but admins', async () => {
    const planner = await signIn(server.url, 'planner@test.example');
    const response = await request(server.url)
      .get('/api/mail-log')
      .set({ Cookie: planner.cookie.join('; ') });
    expect(response.status).toBe(403);
  });
});
