/**
 * Stand-alone: the API as `npm start` runs it (helmet, request log at info, compression, the declared
 * routes), serving a folder of static files as its web app, on a free loopback port. Prints
 * `listening <port>` and serves until killed. Used by forecast-review.ts so that the route and a static
 * file of the same size are served by the same process.
 *
 * node --import tsx bench/api/serve-app.ts <database-url> <static-folder>
 */
import { randomBytes } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { createDb } from '@loadwright/db';
import { pino } from 'pino';
import { createApp } from '../../apps/api/src/app';

const [databaseUrl, staticFolder] = process.argv.slice(2);
if (!databaseUrl || !staticFolder) throw new Error('usage: serve-app.ts <database-url> <static-folder>');
const { db, pool } = createDb(databaseUrl, { max: 10, applicationName: 'loadwright-bench' });
// One log line per request at info, as in production, written to /dev/null so the terminal stays readable.
const logger = pino({ level: 'info' }, pino.destination({ dest: '/dev/null', sync: false }));
const app = createApp({
  db,
  pool,
  logger,
  sessionSecret: randomBytes(48),
  secureCookies: false,
  publicUrl: 'http://127.0.0.1',
  webDist: staticFolder,
});
const server = app.listen(0, '127.0.0.1', () => console.log(`listening ${(server.address() as AddressInfo).port}`));
// Exit normally when the benchmark stops us, so a --cpu-prof profile gets written.
process.on('SIGTERM', () => process.exit(0));
