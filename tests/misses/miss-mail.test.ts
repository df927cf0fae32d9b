/**
 * Miss e-mail through the real queue and SMTP catcher: high severity at once, the rest in the daily
 * digest, each person's choice respected, with the series, hours, actual against forecast and band,
 * the error, the likely cause, the link and the caution; nothing sent twice.
 */
import { eq } from 'drizzle-orm';
import { missRules, users } from '@loadwright/db';
import { listCaughtMail, type CaughtMail } from '@loadwright/mail';
import { detectMisses, sendMissDigest } from '@loadwright/misses';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createPeople } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { actuals, approvedForecast, loadSeries, seriesRule } from './support';

let server: TestServer;
let people: Awaited<ReturnType<typeof createPeople>>;
const url = 'http://127.0.0.1';
const recipients = ['role:admin', 'role:planner', 'role:viewer', 'role:steward', 'control-room@coop.example'];

beforeAll(async () => {
  server = await startTestServer();
  people = await createPeople(server.db);
  // Only this file's rules: the worker's defaults are switched off.
  await server.db.update(missRules).set({ active: false }).where(eq(missRules.scope, 'all'));
  await server.db.update(users).set({ missMail: 'immediate' }).where(eq(users.id, people.viewer.id));
  await server.db.update(users).set({ missMail: 'digest' }).where(eq(users.id, people.admin.id));
  await server.db.update(users).set({ missMail: 'none' }).where(eq(users.id, people.steward.id));
});
afterAll(() => server.close());

/** Waits until the catcher holds `count` messages, then a moment more to see that no more come. */
async function caught(count: number): Promise<CaughtMail[]> {
  for (let i = 0; i < 100 && listCaughtMail(server.outboxFolder).length < count; i++) await new Promise((r) => setTimeout(r, 200));
  await new Promise((r) => setTimeout(r, 1_500));
  return listCaughtMail(server.outboxFolder);
}
const to = (mail: CaughtMail[], address: string) => mail.filter((m) => m.to.includes(address)).map((m) => m.subject);

it('e-mails a high miss at once to those who want it, a medium one only to who wants every miss, and digests the rest', async () => {
  const oct31 = '2026-10-31T15:00:00Z'; // 10:00 CDT
  const high = await loadSeries(server.db, 'north-feeder');
  await approvedForecast(server.db, high, oct31, 24);
  await seriesRule(server.db, high, { kind: 'outside_band', hours: 1, bandLevel: 95, severity: 'high', recipients });
  const medium = await loadSeries(server.db, 'south-feeder');
  await approvedForecast(server.db, medium, oct31, 24);
  await seriesRule(server.db, medium, { kind: 'error_over_threshold', hours: 1, threshold: 10, severity: 'medium', recipients });
  await actuals(server.db, high, oct31, [125]);
  await actuals(server.db, medium, oct31, [80]); // |80 − 100| / 80 = 25 %

  const now = new Date('2026-10-31T17:00:00Z');
  const [first] = (await detectMisses(server.db, high, now, { publicUrl: url })).opened;
  await detectMisses(server.db, medium, now, { publicUrl: url });
  let mail = await caught(4);
  const highSubject = 'High: Test north-feeder — outside the band, 2026-10-31 10:00–11:00 (America/Chicago)';
  const mediumSubject = 'Medium: Test south-feeder — error over threshold, 2026-10-31 10:00–11:00 (America/Chicago)';
  // High: planner (by severity), viewer (every miss at once), the control room address (default); not the
  // admin (digest only) nor the steward (none). Medium: the viewer alone.
  expect(to(mail, people.planner.email)).toEqual([highSubject]);
  expect(to(mail, 'control-room@coop.example')).toEqual([highSubject]);
  expect(to(mail, people.viewer.email).sort()).toEqual([highSubject, mediumSubject]);
  expect(to(mail, people.admin.email)).toEqual([]);
  expect(to(mail, people.steward.email)).toEqual([]);
  const alert = mail.find((m) => m.to.includes(people.planner.email))!;
  expect(alert.text).toContain('Test north-feeder: Actual above the 95 % band for 1 hour, at most 15.0 kW beyond it.');
  expect(alert.text).toContain('2026-10-31 10:00: actual 125.0 kW, forecast 100.0 kW, band 90.0 kW to 110.0 kW, error +25.0 kW');
  expect(alert.text).toContain('Likely cause: The model uses no temperature, so all of the error is model error.');
  expect(alert.text).toContain(`Open the miss: ${url}/misses/${first}`);
  expect(alert.text).toContain('Forecasts are decision support.');
  expect(alert.from).toBe('loadwright@test.example');

  // Judging again sends nothing new.
  await detectMisses(server.db, high, new Date('2026-10-31T18:00:00Z'), { publicUrl: url });
  expect(await caught(4)).toHaveLength(4);

  // The digest (detected-at is the real clock): admin both, planner and the control room the medium one.
  const digestNow = new Date(Date.now() + 60_000);
  expect(await sendMissDigest(server.db, digestNow, url)).toBe(3);
  expect(await sendMissDigest(server.db, digestNow, url)).toBe(0);
  mail = await caught(7);
  expect(mail).toHaveLength(7);
  const digestTo = (address: string) => mail.find((m) => m.to.includes(address) && m.subject.startsWith('Loadwright daily misses'));
  expect(digestTo(people.admin.email)!.subject).toMatch(/^Loadwright daily misses, \d{4}-\d{2}-\d{2}: 2 misses, 1 high$/);
  expect(digestTo(people.planner.email)!.subject).toMatch(/: 1 miss$/);
  expect(digestTo(people.planner.email)!.text).toContain('Medium — Test south-feeder');
  expect(digestTo('control-room@coop.example')).toBeDefined();
  expect(digestTo(people.viewer.email)).toBeUndefined();
  expect(digestTo(people.steward.email)).toBeUndefined();
});
