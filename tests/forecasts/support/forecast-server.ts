/** A test instance with the demo co-op seeded, signed-in people and a read-only API token. */
import { apiTokens, series } from '@loadwright/db';
import request from 'supertest';
import { newApiTokenSecret } from '../../../apps/api/src/auth/api-token-secret';
import { seedDemo } from '../../../libs/db/src/seed/seed-demo';
import { createPeople, signIn, type SignedIn } from '../../support/people';
import { startTestServer, type TestServer } from '../../support/server';

/** What forecast tests work with. */
export interface ForecastTestContext {
  server: TestServer;
  /** Series ids by key (e.g. zone-north, fdr-s3). */
  seriesId: (key: string) => number;
  planner: SignedIn;
  viewer: SignedIn;
  steward: SignedIn;
  admin: SignedIn;
  /** Bearer token of read scope. */
  readToken: string;
}

/** Starts a server without a worker, seeds the demo and signs people in. */
export async function startForecastServer(): Promise<ForecastTestContext> {
  const server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db, '-forecasts');
  const rows = await server.db.select({ id: series.id, key: series.key }).from(series);
  const ids = new Map(rows.map((row) => [row.key, row.id]));
  const { token, prefix, hash } = newApiTokenSecret();
  await server.db
    .insert(apiTokens)
    .values({ name: 'dispatch tool', prefix, secretHash: hash, scope: 'read', createdById: people.admin.id });
  return {
    server,
    seriesId: (key) => {
      const id = ids.get(key);
      if (id === undefined) throw new Error(`no demo series ${key}`);
      return id;
    },
    planner: await signIn(server.url, people.planner.email),
    viewer: await signIn(server.url, people.viewer.email),
    steward: await signIn(server.url, people.steward.email),
    admin: await signIn(server.url, people.admin.email),
    readToken: token,
  };
}

/** A write request as a signed-in browser sends it (session cookie and CSRF header). */
export function asBrowser(url: string, who: SignedIn) {
  const agent = request(url);
  return {
    get: (path: string) => agent.get(path).set('Cookie', who.cookie),
    post: (path: string, body?: object) => agent.post(path).set('Cookie', who.cookie).set('X-CSRF-Token', who.csrf).send(body),
    delete: (path: string) => agent.delete(path).set('Cookie', who.cookie).set('X-CSRF-Token', who.csrf),
  };
}
