/**
 * A Green Button file is read off the API's event loop: while a large file is being parsed, other
 * requests are answered. Proven by order, not by a timer: the file is about 19 MB of interval
 * readings cut short at its very end, so it is refused only once the whole file is parsed, and no
 * database work follows. A request for /api/health sent right after the file's last byte must be
 * answered before that refusal. When parsing ran on the event loop (as it did), the refusal was
 * written in the same turn that finished the parse, before the health request was even read.
 */
import http from 'node:http';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/server';
import { createTokens, type Tokens } from './support/tokens';

let server: TestServer;
let tokens: Tokens;

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  tokens = await createTokens(server.db);
  await server.pool.query(
    `insert into series (key, name, kind, level, unit, time_zone) values ('gb-stall', 'Stall feeder', 'load', 'feeder', 'kW', 'America/Chicago')`,
  );
});
afterAll(() => server.close());

/** The hourly fixture with its first IntervalBlock repeated to about 19 MB, then cut short inside a final entry. */
function largeTruncatedFeed(): Buffer {
  const xml = readFileSync(resolve(import.meta.dirname, '../../fixtures/green-button/hourly-energy-wh.xml'), 'utf8');
  const reading = /<IntervalReading>[\s\S]*?<\/IntervalReading>/.exec(xml)![0];
  const many = `${reading}\n`.repeat(Math.ceil((19 * 1024 * 1024) / (reading.length + 1)));
  const body = xml.replace(reading, many).replace('</feed>', '<entry><title>cut short');
  return Buffer.from(body);
}

it('answers /api/health while a large Green Button file is parsed, before the file is refused', async () => {
  const file = largeTruncatedFeed();
  expect(file.length).toBeGreaterThan(19 * 1024 * 1024);
  expect(file.length).toBeLessThan(20 * 1024 * 1024); // under the 20 MB limit, so it is parsed, not refused for size
  const order: string[] = [];
  const url = new URL(`${server.url}/api/series/gb-stall/green-button`);
  const upload = new Promise<{ status: number; body: string }>((done, fail) => {
    const call = http.request(
      url,
      {
        method: 'POST',
        headers: { 'Content-Type': 'application/atom+xml', 'Content-Length': file.length, Authorization: `Bearer ${tokens.readWrite}` },
      },
      (response) => {
        let body = '';
        response.setEncoding('utf8').on('data', (chunk: string) => (body += chunk));
        response.on('end', () => {
          order.push('upload');
          done({ status: response.statusCode!, body });
        });
      },
    );
    call.on('error', fail);
    call.end(file);
    // Sent once the last byte of the file has gone: the server is about to parse, or parsing.
    call.on('finish', () => {
      health = fetch(`${server.url}/api/health`).then((response) => {
        order.push('health');
        return response.status;
      });
    });
  });
  let health: Promise<number> | undefined;
  const refused = await upload;
  expect(await health).toBeLessThan(600);
  expect(refused.status).toBe(400);
  expect(JSON.parse(refused.body).detail).toMatch(/^The file is not well-formed XML: The file ends inside <title>/);
  expect(order).toEqual(['health', 'upload']);
});
