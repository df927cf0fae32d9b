/**
 * Every declared route × every kind of caller, refused or allowed exactly as the permission table
 * says. The route list is read from the running app, so a new route is covered the moment it exists,
 * and a route mounted outside the declared table fails the first test.
 */
import { randomUUID } from 'node:crypto';
import { permissionTable, roles, type Permission, type Role } from '@loadwright/contracts';
import { apiTokens } from '@loadwright/db';
import { SignJWT } from 'jose';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newApiTokenSecret } from '../../apps/api/src/auth/api-token-secret';
import type { RouteDefinition } from '../../apps/api/src/http/route-table';
import { openApiPath } from '../../apps/api/src/http/openapi';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;
let people: Awaited<ReturnType<typeof createPeople>>;
/** People whose sessions the refused cases expire and revoke, apart from those the allowed cases use. */
let spentPeople: Awaited<ReturnType<typeof createPeople>>;
/** One signed-in browser per role, replaced after a request that signs it out. */
const browsers = new Map<Role, SignedIn>();
const tokens: Record<'read' | 'read-write' | 'revoked', string> = { read: '', 'read-write': '', revoked: '' };

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  people = await createPeople(server.db);
  spentPeople = await createPeople(server.db, '-spent');
  for (const kind of ['read', 'read-write', 'revoked'] as const) {
    const { token, prefix, hash } = newApiTokenSecret();
    await server.db.insert(apiTokens).values({
      name: kind,
      prefix,
      secretHash: hash,
      scope: kind === 'revoked' ? 'read-write' : kind,
      revokedAt: kind === 'revoked' ? new Date() : null,
      createdById: people.admin.id, // a token acts for its creator, here an admin holding every permission
    });
    tokens[kind] = token;
  }
});
afterAll(() => server.close());

type Caller =
  | { kind: 'role'; role: Role }
  | { kind: 'token'; scope: 'read' | 'read-write' }
  | { kind: 'refused'; name: 'no session' | 'expired session' | 'revoked session' | 'revoked token' | 'forged session' };

const callers: Caller[] = [
  ...roles.map((role) => ({ kind: 'role' as const, role })),
  { kind: 'token', scope: 'read' },
  { kind: 'token', scope: 'read-write' },
  ...(['no session', 'expired session', 'revoked session', 'revoked token', 'forged session'] as const).map((name) => ({
    kind: 'refused' as const,
    name,
  })),
];

function callerName(caller: Caller): string {
  return caller.kind === 'role' ? caller.role : caller.kind === 'token' ? `${caller.scope} token` : caller.name;
}

/** What the permission table says this caller may do on this route. */
function expectedAllowed(route: RouteDefinition, caller: Caller): boolean {
  if (route.access === 'public') return true;
  const entry = permissionTable[route.access as Permission];
  if (caller.kind === 'role') return (entry.roles as readonly string[]).includes(caller.role);
  if (caller.kind === 'token') return (entry.tokenScopes as readonly string[]).includes(caller.scope);
  return false;
}

/** Headers that present the caller. */
async function present(caller: Caller): Promise<Record<string, string>> {
  const asBrowser = (browser: SignedIn) => ({ Cookie: browser.cookie.join('; '), 'X-CSRF-Token': browser.csrf });
  if (caller.kind === 'role') {
    if (!browsers.has(caller.role)) browsers.set(caller.role, await signIn(server.url, people[caller.role].email));
    return asBrowser(browsers.get(caller.role)!);
  }
  if (caller.kind === 'token') return { Authorization: `Bearer ${tokens[caller.scope]}` };
  switch (caller.name) {
    case 'no session':
      return {};
    case 'revoked token':
      return { Authorization: `Bearer ${tokens.revoked}` };
    case 'forged session': {
      const forged = await new SignJWT({ sid: randomUUID() })
        .setProtectedHeader({ alg: 'HS256' })
        .setSubject(String(people.admin.id))
        .setIssuer('loadwright')
        .setAudience('loadwright-web')
        .setExpirationTime('10m')
        .sign(new TextEncoder().encode('not the server key, but 32+ bytes long'));
      return { Cookie: `lw_session=${forged}` };
    }
    case 'expired session': {
      const browser = await signIn(server.url, spentPeople.admin.email);
      await server.pool.query(`UPDATE sessions SET expires_at = now() - interval '1 second' WHERE user_id = $1 AND revoked_at IS NULL`, [
        spentPeople.admin.id,
      ]);
      return asBrowser(browser);
    }
    case 'revoked session': {
      const browser = await signIn(server.url, spentPeople.admin.email);
      await server.pool.query(`UPDATE sessions SET revoked_at = now() WHERE user_id = $1`, [spentPeople.admin.id]);
      return asBrowser(browser);
    }
  }
}

/** A concrete URL for a route's path, with placeholder ids that match nothing. */
function concretePath(path: string): string {
  return `/api${path.replace(/:(\w+)/g, '999999')}`;
}

describe('routes', () => {
  it('are all declared: the app mounts no API route outside the route table', () => {
    type Layer = { route?: { path: string; methods: Record<string, boolean> }; handle?: { stack?: Layer[] } };
    const mounted: string[] = [];
    const walk = (stack: Layer[]) => {
      for (const layer of stack) {
        if (layer.route) for (const method of Object.keys(layer.route.methods)) mounted.push(`${method} ${layer.route.path}`);
        else if (layer.handle?.stack) walk(layer.handle.stack);
      }
    };
    walk((server.app as unknown as { router: { stack: Layer[] } }).router.stack);
    const declared = server.routes.map((r) => `${r.method} ${r.path}`);
    expect(new Set(declared).size).toBe(declared.length);
    for (const route of server.routes) expect(['public', ...Object.keys(permissionTable)]).toContain(route.access);
    // Besides the declared routes, only the web app's own fallback is mounted.
    expect(mounted.filter((m) => !declared.includes(m))).toEqual(server.app.locals['webFallback'] ? ['get /{*splat}'] : []);
    expect(declared.every((d) => mounted.includes(d))).toBe(true);
  });

  it('are all described in /api/openapi.json', async () => {
    const response = await request(server.url).get('/api/openapi.json');
    expect(response.status).toBe(200);
    expect(response.body.openapi).toBe('3.1.0');
    for (const route of server.routes) {
      expect(
        response.body.paths[openApiPath(route.path)]?.[route.method],
        `${route.method} ${route.path} missing from OpenAPI`,
      ).toBeDefined();
    }
  });
});

describe('access matrix', () => {
  it('allows or refuses every route for every caller exactly as the permission table says', async () => {
    const mismatches: string[] = [];
    let cells = 0;
    for (const route of server.routes) {
      for (const caller of callers) {
        const headers = await present(caller);
        const response = await request(server.url)
          [route.method](concretePath(route.path))
          .set(headers)
          .send(route.body ? {} : undefined);
        const allowed = expectedAllowed(route, caller);
        const refusal = caller.kind === 'refused' ? 401 : 403; // nobody identified: 401; identified but not permitted: 403
        const ok = allowed ? response.status !== 401 && response.status !== 403 : response.status === refusal;
        if (route.path === '/auth/sign-out' && caller.kind === 'role') browsers.delete(caller.role);
        if (!ok)
          mismatches.push(
            `${route.method.toUpperCase()} ${route.path} as ${callerName(caller)}: got ${response.status}, expected ${allowed ? 'allowed' : refusal}`,
          );
        cells++;
      }
    }
    expect(mismatches).toEqual([]);
    expect(cells).toBe(server.routes.length * callers.length);
  });
});
