/**
 * The broken-file corpus (fixtures/intake/broken/manifest.json): each file is uploaded as a steward,
 * confirmed with the proposed mapping (or the case's own), and must be refused with exactly its
 * message, at whichever step finds the problem, leaving no reading and no finding behind.
 */
import { readFileSync } from 'node:fs';
import { series } from '@loadwright/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { confirm, postFile, waitForImport } from './upload-client';

interface BrokenCase {
  file: string;
  about: string;
  mapping?: Record<string, unknown>;
  settings?: Record<string, unknown>;
  expected: string;
}

const folder = new URL('../../fixtures/intake/broken/', import.meta.url);
const cases = JSON.parse(readFileSync(new URL('manifest.json', folder), 'utf8')) as BrokenCase[];

let server: TestServer;
let steward: SignedIn;

beforeAll(async () => {
  server = await startTestServer();
  const people = await createPeople(server.db);
  steward = await signIn(server.url, people.steward.email);
  const load = { kind: 'load', level: 'feeder', unit: 'kW', intervalMinutes: 60, timeZone: 'America/Chicago' } as const;
  await server.db.insert(series).values([
    { key: 'fdr-a', name: 'Feeder A', ...load },
    { key: 'fdr-b', name: 'Feeder B', ...load },
    { key: 'wx-a', name: 'Station A', kind: 'temperature', unit: 'degF', intervalMinutes: 60, timeZone: 'America/Chicago' },
  ]);
});
afterAll(() => server.close());

/** Rows that a refused file must not leave behind. */
const stored = async () => {
  const { rows } = await server.pool.query(
    `select (select count(*) from observations)::int as observations, (select count(*) from observation_revisions)::int as revisions, (select count(*) from upload_findings)::int as findings`,
  );
  return rows[0] as { observations: number; revisions: number; findings: number };
};

/** Uploads and confirms a case; returns the message it was refused with, or null when it imported. */
async function refusal(entry: BrokenCase): Promise<string | null> {
  const posted = await postFile(server.url, steward, entry.file, readFileSync(new URL(entry.file, folder)));
  expect(posted.status).toBe(201);
  if (posted.body.upload.status === 'failed') {
    expect(posted.body.message).toBe(posted.body.upload.error);
    return posted.body.upload.error;
  }
  const proposal = posted.body.proposal;
  const mapping = entry.mapping ?? proposal.mapping;
  const settings = { ...proposal.settings, ...entry.settings };
  const confirmed = await confirm(server.url, steward, posted.body.upload.id, { mapping, settings });
  if (confirmed.status === 400) return confirmed.body.detail;
  expect(confirmed.status).toBe(200);
  const done = await waitForImport(server.url, steward, posted.body.upload.id);
  return done.upload.status === 'failed' ? done.upload.error : null;
}

describe('the broken-file corpus', () => {
  it('holds at least 30 cases, each with its file', () => {
    expect(cases.length).toBeGreaterThanOrEqual(30);
    expect(new Set(cases.map((c) => c.file)).size).toBe(cases.length);
  });

  for (const entry of cases) {
    it(`refuses ${entry.file} (${entry.about}) with its message and stores nothing`, async () => {
      const before = await stored();
      expect(await refusal(entry)).toBe(entry.expected);
      expect(await stored()).toEqual(before);
    });
  }

  it('stored nothing from the whole corpus', async () => {
    expect(await stored()).toEqual({ observations: 0, revisions: 0, findings: 0 });
  });
});
