/**
 * The unusual-file corpus (fixtures/intake/unusual/manifest.json, written from unusual-cases.ts): each
 * file is uploaded through the real upload API as a steward would, its proposal checked, confirmed
 * with the proposal (and the case's own changes), imported by the worker, and then every stored raw
 * reading and the findings per rule are checked in the database; a refused file leaves nothing.
 */
import { readFileSync } from 'node:fs';
import { series } from '@loadwright/db';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UnusualCase } from '../../fixtures/intake/unusual-cases';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { confirm, postFile, waitForImport } from './upload-client';

const folder = new URL('../../fixtures/intake/unusual/', import.meta.url);
const cases = JSON.parse(readFileSync(new URL('manifest.json', folder), 'utf8')) as Omit<UnusualCase, 'content'>[];

let server: TestServer;
let steward: SignedIn;

beforeAll(async () => {
  server = await startTestServer();
  steward = await signIn(server.url, (await createPeople(server.db)).steward.email);
  const catalogue = new Map(cases.flatMap((c) => c.catalogue).map((entry) => [entry.key, entry]));
  await server.db
    .insert(series)
    .values([...catalogue.values()].map((entry) => ({ ...entry, name: entry.key.toUpperCase(), level: 'feeder' as const })));
});
afterAll(() => server.close());

/** Every stored raw reading of an upload as [key, instant, value], by key then time. */
async function storedOf(uploadId: number): Promise<Array<[string, string, number]>> {
  const { rows } = await server.pool.query(
    `select s.key, o.ts, o.value from observations o join series s on s.id = o.series_id
     where o.upload_id = $1 and o.value is not null order by s.key, o.ts`,
    [uploadId],
  );
  return rows.map((r) => [r.key as string, (r.ts as Date).toISOString(), r.value as number]);
}

/** Findings per rule of an upload. */
async function findingsOf(uploadId: number): Promise<Record<string, number>> {
  const { rows } = await server.pool.query(`select rule, count(*)::int as n from upload_findings where upload_id = $1 group by rule`, [
    uploadId,
  ]);
  return Object.fromEntries(rows.map((r) => [r.rule as string, r.n as number]));
}

describe('the unusual-file corpus', () => {
  it('holds a case of each kind the issue names', () => {
    expect(cases.length).toBeGreaterThanOrEqual(18);
    expect(new Set(cases.map((c) => c.file)).size).toBe(cases.length);
  });

  for (const entry of cases) {
    it(`${entry.file}: ${entry.about}`, async () => {
      const posted = await postFile(server.url, steward, entry.file, readFileSync(new URL(entry.file, folder)));
      expect(posted.status).toBe(201);
      const id = posted.body.upload.id as number;
      let refusal: string | null = null;
      if (posted.body.upload.status === 'failed') {
        refusal = posted.body.upload.error;
      } else {
        const proposal = posted.body.proposal;
        if (entry.proposal?.mapping) expect(proposal.mapping).toEqual(entry.proposal.mapping);
        if (entry.proposal?.settings) expect(proposal.settings).toMatchObject(entry.proposal.settings);
        for (const note of entry.proposal?.notes ?? []) expect(proposal.notes).toContain(note);
        const body = { mapping: entry.mapping ?? proposal.mapping, settings: { ...proposal.settings, ...entry.settings } };
        const confirmed = await confirm(server.url, steward, id, body);
        if (confirmed.status === 400) refusal = confirmed.body.detail;
        else {
          expect(confirmed.status).toBe(200);
          const done = await waitForImport(server.url, steward, id);
          if (done.upload.status === 'failed') refusal = done.upload.error;
          else if ('stored' in entry.expected) expect(done.upload.rowsRejected).toBe(entry.expected.rowsRejected);
        }
      }
      if ('refused' in entry.expected) {
        expect(refusal).toBe(entry.expected.refused);
        expect(await storedOf(id)).toEqual([]);
        expect(await findingsOf(id)).toEqual({});
      } else {
        expect(refusal).toBeNull();
        expect(await storedOf(id)).toEqual(entry.expected.stored);
        expect(await findingsOf(id)).toEqual(entry.expected.findings);
      }
    });
  }

  it('never returns the refused 1e300 kW through the history API', async () => {
    const history = await request(server.url)
      .get('/api/series/tv-f106/readings')
      .query({ from: '2026-06-01T00:00:00Z', to: '2026-06-02T00:00:00Z' })
      .set('Cookie', steward.cookie);
    expect(history.status).toBe(200);
    const values = JSON.stringify(history.body);
    expect(values).not.toContain('1e+300');
    expect(await server.pool.query(`select count(*)::int as n from observations where value > 1e9`)).toMatchObject({ rows: [{ n: 0 }] });
  });
});
