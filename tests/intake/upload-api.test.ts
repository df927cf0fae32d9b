/**
 * The upload routes end to end with the worker: a steward uploads, confirms and watches the import
 * finish; the same bytes again add nothing; a corrected file makes revision 2 and keeps revision 1;
 * the report downloads as spreadsheet-safe CSV; a viewer cannot upload.
 */
import { series } from '@loadwright/db';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { confirm, postFile, waitForImport } from './upload-client';

let server: TestServer;
let steward: SignedIn;
let viewer: SignedIn;

const hour = 3_600_000;
const start = Date.UTC(2026, 5, 1, 5);
const load = (h: number) => Math.round((800 + 150 * Math.sin((2 * Math.PI * h) / 24) + 9 * Math.cos(1.7 * h)) * 10) / 10;

/** A long file of two feeders over four days, one value per row, hour 50 of fdr-a missing. */
function longFile(change?: { key: string; hour: number; value: number }): string {
  const lines = ['timestamp,feeder,load_kw'];
  for (let h = 0; h < 96; h++) {
    for (const key of ['fdr-a', 'fdr-b']) {
      if (key === 'fdr-a' && h === 50) continue;
      const value = change && change.key === key && change.hour === h ? change.value : load(h) + (key === 'fdr-b' ? 100 : 0);
      lines.push(`${new Date(start + h * hour).toISOString()},${key},${value}`);
    }
  }
  return `${lines.join('\n')}\n`;
}

const settings = {
  unit: 'kW',
  timeZone: 'America/Chicago',
  timestampsMark: 'start',
  repeatedHourPolicy: 'reject',
  decimalSeparator: '.',
  estimateShortGaps: true,
} as const;
const mapping = {
  layout: 'long',
  timestampColumn: 'timestamp',
  valueColumn: 'load_kw',
  seriesKeyColumn: 'feeder',
  seriesKey: null,
} as const;

beforeAll(async () => {
  server = await startTestServer();
  const people = await createPeople(server.db);
  steward = await signIn(server.url, people.steward.email);
  viewer = await signIn(server.url, people.viewer.email);
  for (const key of ['fdr-a', 'fdr-b']) {
    await server.db
      .insert(series)
      .values({ key, name: key, kind: 'load', level: 'feeder', unit: 'kW', intervalMinutes: 60, timeZone: 'America/Chicago' });
  }
});
afterAll(() => server.close());

const count = async (table: string) => Number((await server.pool.query(`select count(*) as n from ${table}`)).rows[0].n);

describe('uploads', () => {
  let firstId = 0;

  it('previews, proposes the mapping, imports with progress to 100 and reports the gap it estimated', async () => {
    const posted = await postFile(server.url, steward, 'feeders.csv', longFile());
    expect(posted.status).toBe(201);
    expect(posted.body.upload.status).toBe('received');
    expect(posted.body.layout).toMatchObject({
      delimiter: ',',
      hasHeader: true,
      columns: ['timestamp', 'feeder', 'load_kw'],
      timestampsHaveOffset: true,
    });
    expect(posted.body.preview.rows).toHaveLength(20);
    expect(posted.body.proposal.mapping).toEqual(mapping);
    expect(posted.body.proposal.settings).toMatchObject({
      unit: 'kW',
      timeZone: 'America/Chicago',
      repeatedHourPolicy: 'by-order',
      slashDateOrder: 'month-first',
      // The file's hourly rows match the hourly series: nothing to combine.
      fileIntervalMinutes: null,
    });
    firstId = posted.body.upload.id;

    const confirmed = await confirm(server.url, steward, firstId, { mapping, settings });
    expect(confirmed.status).toBe(200);
    expect(confirmed.body.status).toBe('queued');
    const done = await waitForImport(server.url, steward, firstId);
    expect(done.upload).toMatchObject({ status: 'done', progress: 100, rowsTotal: 191, rowsImported: 192, rowsUnchanged: 0, error: null });
    expect(done.report.counts).toEqual([
      expect.objectContaining({ rule: 'gap', count: 1 }),
      expect.objectContaining({ rule: 'estimated', count: 1 }),
    ]);
    expect(done.report.examples.find((f) => f.rule === 'gap')).toMatchObject({
      seriesKey: 'fdr-a',
      ts: new Date(start + 50 * hour).toISOString(),
      detail: { intervals: 1, estimated: true },
    });
    expect(await count('observations')).toBe(192);
  });

  it('answers the same bytes with the earlier upload and adds nothing', async () => {
    const before = { observations: await count('observations'), uploads: await count('uploads') };
    const again = await postFile(server.url, steward, 'feeders-copy.csv', longFile());
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ duplicateOf: firstId, message: `Already imported as upload ${firstId}; nothing was added.` });
    expect({ observations: await count('observations'), uploads: await count('uploads') }).toEqual(before);
  });

  it('makes revision 2 from a corrected file and keeps revision 1', async () => {
    const posted = await postFile(server.url, steward, 'feeders-corrected.csv', longFile({ key: 'fdr-b', hour: 10, value: 1234.5 }));
    expect(posted.status).toBe(201);
    await confirm(server.url, steward, posted.body.upload.id, { mapping, settings }).expect(200);
    const done = await waitForImport(server.url, steward, posted.body.upload.id);
    expect(done.upload).toMatchObject({ status: 'done', rowsImported: 0, rowsRevised: 1, rowsUnchanged: 191 });
    const ts = new Date(start + 10 * hour);
    const current = await server.pool.query(
      `select o.value, o.revision from observations o join series s on s.id = o.series_id where s.key = 'fdr-b' and o.ts = $1`,
      [ts],
    );
    expect(current.rows).toEqual([{ value: 1234.5, revision: 2 }]);
    const kept = await server.pool.query(
      `select r.value, r.revision, r.upload_id, r.superseded_by_upload_id from observation_revisions r join series s on s.id = r.series_id where s.key = 'fdr-b' and r.ts = $1`,
      [ts],
    );
    expect(kept.rows).toEqual([{ value: load(10) + 100, revision: 1, upload_id: firstId, superseded_by_upload_id: posted.body.upload.id }]);
  });

  it('downloads the findings as CSV with formula-like text neutralised', async () => {
    const posted = await postFile(
      server.url,
      steward,
      'unknown.csv',
      'timestamp,feeder,load_kw\n2026-06-01T05:00:00Z,"=HYPERLINK(""x"")",5\n2026-06-01T05:00:00Z,fdr-a,800\n',
    );
    await confirm(server.url, steward, posted.body.upload.id, { mapping, settings }).expect(200);
    const done = await waitForImport(server.url, steward, posted.body.upload.id);
    expect(done.upload.status).toBe('done');
    const csv = await request(server.url).get(`/api/uploads/${posted.body.upload.id}/report.csv`).set('Cookie', steward.cookie);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    const lines = csv.text.trim().split('\r\n');
    expect(lines[0]).toBe('rule,series,ts,value,source_row,detail');
    expect(lines[1]).toBe(`unknown_series,,,,2,"{""key"":""=HYPERLINK(\\""x\\"")"",""column"":""feeder""}"`);
  });

  it('refuses an upload from a viewer', async () => {
    const refused = await postFile(server.url, viewer, 'feeders.csv', longFile());
    expect(refused.status).toBe(403);
  });

  it('names the column when a mapping does not fit, and keeps the upload for another try', async () => {
    const posted = await postFile(server.url, steward, 'other.csv', 'timestamp,feeder,load_kw\n2026-06-02T05:00:00Z,fdr-a,800\n');
    const wrong = await confirm(server.url, steward, posted.body.upload.id, { mapping: { ...mapping, valueColumn: 'kw' }, settings });
    expect(wrong.status).toBe(400);
    expect(wrong.body.detail).toBe(
      'The mapping names value column "kw", which the file does not have; its columns are "timestamp", "feeder", "load_kw".',
    );
    const listed = await request(server.url).get('/api/uploads').set('Cookie', steward.cookie);
    expect(listed.body.items.find((u: { id: number }) => u.id === posted.body.upload.id).status).toBe('received');

    const discarded = await request(server.url)
      .delete(`/api/uploads/${posted.body.upload.id}`)
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf);
    expect(discarded.status).toBe(204);
    expect((await request(server.url).get(`/api/uploads/${posted.body.upload.id}`).set('Cookie', steward.cookie)).status).toBe(404);
    const again = await request(server.url)
      .delete(`/api/uploads/${firstId}`)
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf);
    expect(again.status).toBe(409);
  });
});
