/**
 * Bad input never reaches a 500 and never writes anything. The cases are generated from the OpenAPI
 * document (like the access matrix), so a new route or field is walked the moment it exists: ids
 * beyond PostgreSQL's int4 and ids written loosely, text with a NUL or a lone UTF-16 surrogate in
 * every field of every body and in every query parameter, impossible dates, a bogus charset or
 * Content-Encoding, malformed multipart, and XML with a DTD or absurd nesting. Every answer must be a
 * 4xx RFC 9457 problem saying what is wrong, and every table must hold as many rows as before.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { int4Max } from '@loadwright/contracts';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;
let admin: SignedIn;
let document: OpenApiDocument;

interface JsonSchema {
  type?: string | string[];
  format?: string;
  pattern?: string;
  enum?: unknown[];
  minimum?: number;
  maximum?: number;
  minLength?: number;
  maxLength?: number;
  minItems?: number;
  properties?: Record<string, JsonSchema>;
  items?: JsonSchema;
  oneOf?: JsonSchema[];
  anyOf?: JsonSchema[];
}
interface Parameter {
  in: 'path' | 'query';
  name: string;
  schema: JsonSchema;
}
interface Operation {
  parameters?: Parameter[];
  requestBody?: { content: Record<string, { schema: JsonSchema }> };
}
interface OpenApiDocument {
  paths: Record<string, Record<string, Operation>>;
}

/** One bad request and what a correct answer looks like. */
interface Case {
  name: string;
  method: string;
  url: string;
  headers?: Record<string, string>;
  /** A JSON value, or raw bytes sent as they are. */
  body?: unknown;
  raw?: Buffer;
  /** Expected status (default: any 4xx other than 401 and 403, which would mean the input was never read). */
  status?: number;
  /** A pointer the problem's `errors` must name. */
  pointer?: string;
  /** Text the problem's detail must contain. */
  detail?: RegExp;
}

const writing = new Set(['post', 'put', 'patch', 'delete']);
const nul = 'bad\u0000text';
const loneSurrogate = 'bad\ud800text';
/** 3,000,000,000 is above int4's maximum of 2,147,483,647 (PostgreSQL manual, "Numeric Types"). */
const beyondInt4 = 3_000_000_000;

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  const people = await createPeople(server.db);
  admin = await signIn(server.url, people.admin.email);
  // A live series for the routes under /api/series/:series, so their bodies are read rather than refused as not found.
  await server.pool.query(
    `insert into series (key, name, kind, level, unit, time_zone) values ('walker-key', 'Walker feeder', 'load', 'feeder', 'kW', 'America/Chicago')`,
  );
  document = (await request(server.url).get('/api/openapi.json')).body as OpenApiDocument;
});
afterAll(() => server.close());

/** A plausible value for a schema: enough for parsing to reach the field being spoiled. */
function sample(schema: JsonSchema, name = ''): unknown {
  const variants = schema.oneOf ?? schema.anyOf;
  if (variants) return sample(variants[0]!, name);
  if (schema.enum) return schema.enum.find((value) => value !== null);
  const type = Array.isArray(schema.type) ? schema.type.find((t) => t !== 'null') : schema.type;
  switch (type) {
    case 'object':
      return Object.fromEntries(Object.entries(schema.properties ?? {}).map(([key, value]) => [key, sample(value, key)]));
    case 'array':
      return Array.from({ length: Math.max(1, schema.minItems ?? 1) }, () => sample(schema.items ?? {}, name));
    case 'integer':
    case 'number':
      return Math.max(schema.minimum ?? 1, 1);
    case 'boolean':
      return true;
    default:
      if (schema.format === 'date') return '2026-01-05';
      if (schema.format === 'date-time') return '2026-01-05T06:00:00Z';
      if (/email/i.test(name)) return 'walker@test.example';
      if (schema.pattern === '^[a-z][a-z0-9-]*$') return 'walker-key';
      return 'walker text sample'.padEnd(schema.minLength ?? 0, '.').slice(0, schema.maxLength ?? 200);
  }
}

/** Each leaf of a sampled body with its JSON pointer and schema. */
function leaves(value: unknown, schema: JsonSchema, pointer = ''): { pointer: string; schema: JsonSchema }[] {
  const variants = schema.oneOf ?? schema.anyOf;
  if (variants) return leaves(value, variants[0]!, pointer);
  if (Array.isArray(value)) return value.flatMap((item, i) => leaves(item, schema.items ?? {}, `${pointer}/${i}`));
  if (value !== null && typeof value === 'object')
    return Object.entries(value).flatMap(([key, item]) => leaves(item, schema.properties?.[key] ?? {}, `${pointer}/${key}`));
  return [{ pointer, schema }];
}

/** A copy of `body` with the value at `pointer` replaced. */
function replaced(body: unknown, pointer: string, value: unknown): unknown {
  const copy = structuredClone(body) as Record<string, unknown>;
  const parts = pointer.split('/').slice(1);
  let node: Record<string, unknown> = copy;
  for (const part of parts.slice(0, -1)) node = node[part] as Record<string, unknown>;
  node[parts.at(-1)!] = value;
  return copy;
}

const isDigitsParameter = (schema: JsonSchema) => schema.pattern === '^[0-9]+$';

/** The cases for one operation. */
function casesFor(path: string, method: string, operation: Operation): Case[] {
  const parameters = operation.parameters ?? [];
  const pathParameters = parameters.filter((p) => p.in === 'path');
  const fill = (overrides: Record<string, string> = {}) =>
    path.replace(/\{(\w+)\}/g, (_, name: string) => {
      if (name in overrides) return overrides[name]!;
      const parameter = pathParameters.find((p) => p.name === name);
      return parameter && isDigitsParameter(parameter.schema) ? '1' : 'walker-key';
    });
  const bodySchema = operation.requestBody?.content['application/json']?.schema;
  const body = bodySchema ? sample(bodySchema) : undefined;
  const cases: Case[] = [];
  const label = `${method.toUpperCase()} ${path}`;

  if (writing.has(method)) {
    for (const parameter of pathParameters) {
      if (isDigitsParameter(parameter.schema)) {
        for (const written of [String(beyondInt4), '0x10', '1e3', '-1', '1.5', '%2010']) {
          cases.push({
            name: `${label} with ${parameter.name}=${written}`,
            method,
            url: fill({ [parameter.name]: written }),
            body,
            status: 400,
            pointer: `/params/${parameter.name}`,
            detail: /decimal digits|at most|or less/,
          });
        }
      } else {
        cases.push({
          name: `${label} with a NUL in ${parameter.name}`,
          method,
          url: fill({ [parameter.name]: 'bad%00key' }),
          body,
          status: 400,
          pointer: `/params/${parameter.name}`,
          detail: /NUL/,
        });
        cases.push({
          name: `${label} with a lone surrogate in ${parameter.name}`,
          method,
          url: fill({ [parameter.name]: 'bad%ED%A0%80key' }),
          body,
          status: 400,
        });
      }
    }
    if (bodySchema) {
      for (const leaf of leaves(body, bodySchema)) {
        const spoil = (what: string, value: unknown, detail?: RegExp) =>
          cases.push({
            name: `${label} with ${what} at ${leaf.pointer}`,
            method,
            url: fill(),
            body: replaced(body, leaf.pointer, value),
            status: 400,
            pointer: leaf.pointer,
            detail,
          });
        const type = Array.isArray(leaf.schema.type) ? leaf.schema.type : [leaf.schema.type];
        if (type.includes('string') || leaf.schema.enum?.some((v) => typeof v === 'string')) {
          spoil('a NUL', nul, /NUL/);
          spoil('a lone surrogate', loneSurrogate, /surrogate/);
        }
        if (leaf.schema.format === 'date') spoil('the date 0000-01-01', '0000-01-01');
        if (leaf.schema.format === 'date-time') spoil('the instant 0000-01-01T00:00:00Z', '0000-01-01T00:00:00Z');
        if (type.includes('integer')) spoil(`the integer ${beyondInt4}`, beyondInt4);
      }
      cases.push({
        name: `${label} with a NUL in a field name`,
        method,
        url: fill(),
        body: { ...(body as object), ['na\u0000me']: 'x' },
        status: 400,
        detail: /NUL/,
      });
      const raw = Buffer.from(JSON.stringify(body));
      cases.push({
        name: `${label} in charset=bogus`,
        method,
        url: fill(),
        raw,
        headers: { 'Content-Type': 'application/json; charset=bogus' },
        status: 415,
        detail: /charset/,
      });
      cases.push({
        name: `${label} with Content-Encoding: bogus`,
        method,
        url: fill(),
        raw,
        headers: { 'Content-Type': 'application/json', 'Content-Encoding': 'bogus' },
        status: 415,
        detail: /Content-Encoding/,
      });
      cases.push({
        name: `${label} with a gzip body that is not gzip`,
        method,
        url: fill(),
        raw,
        headers: { 'Content-Type': 'application/json', 'Content-Encoding': 'gzip' },
        status: 400,
      });
    }
  }
  for (const parameter of parameters.filter((p) => p.in === 'query')) {
    const query = (value: string) => `${fill()}?${parameter.name}=${value}`;
    const spoil = (what: string, value: string, detail?: RegExp) =>
      cases.push({
        name: `${label} with ${what} in ?${parameter.name}`,
        method,
        url: query(value),
        body,
        status: 400,
        pointer: `/query/${parameter.name}`,
        detail,
      });
    if (isDigitsParameter(parameter.schema)) {
      spoil(String(beyondInt4), String(beyondInt4 * 10)); // above every limit, and above int4 for ids
      spoil('0x10', '0x10', /decimal digits/);
      spoil('1e3', '1e3', /decimal digits/);
    } else if (parameter.schema.format === 'date') spoil('0000-01-01', '0000-01-01');
    else if (parameter.schema.format === 'date-time') spoil('0000-01-01T00:00:00Z', '0000-01-01T00:00:00Z');
    else if (!parameter.schema.enum) spoil('a NUL', 'bad%00text', /NUL/);
  }
  return cases;
}

/** Raw bodies no schema describes: multipart uploads and Green Button XML. */
function specialCases(): Case[] {
  const multipart = (boundary: string, body: string, contentType = `multipart/form-data; boundary=${boundary}`): Partial<Case> => ({
    raw: Buffer.from(body, 'latin1'),
    headers: { 'Content-Type': contentType },
  });
  const part = (fileName: string) =>
    `--b0\r\nContent-Disposition: form-data; name="file"; filename="${fileName}"\r\nContent-Type: text/csv\r\n\r\nts,value\r\n2026-01-01T00:00:00Z,1\r\n--b0--\r\n`;
  const deep = `<feed>${'<a>'.repeat(10_000)}${'</a>'.repeat(10_000)}</feed>`;
  const dtd = `<?xml version="1.0"?><!DOCTYPE feed [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;">]><feed xmlns="http://www.w3.org/2005/Atom"><title>&lol2;</title></feed>`;
  return [
    {
      name: 'POST /api/uploads with a multipart body cut short',
      method: 'post',
      url: '/api/uploads',
      ...multipart('b0', '--b0\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\n\r\nts,value\r\n'),
      status: 400,
      detail: /multipart/,
    },
    {
      name: 'POST /api/uploads with a multipart type without boundary',
      method: 'post',
      url: '/api/uploads',
      ...multipart('b0', part('a.csv'), 'multipart/form-data'),
      status: 400,
    },
    {
      name: 'POST /api/uploads with a broken part header',
      method: 'post',
      url: '/api/uploads',
      ...multipart('b0', '--b0\r\nContent-Disposition form-data name\r\n\r\nxx\r\n--b0--\r\n'),
      status: 400,
    },
    {
      name: 'POST /api/uploads with a NUL in the file name',
      method: 'post',
      url: '/api/uploads',
      ...multipart('b0', part('a\u0000b.csv')),
      status: 400,
    },
    {
      name: 'POST green-button with a DTD',
      method: 'post',
      url: '/api/series/walker-key/green-button',
      raw: Buffer.from(dtd),
      headers: { 'Content-Type': 'application/atom+xml' },
      status: 400,
      detail: /DTD|DOCTYPE/,
    },
    {
      name: 'POST green-button with 10,000-deep nesting',
      method: 'post',
      url: '/api/series/walker-key/green-button',
      raw: Buffer.from(deep),
      headers: { 'Content-Type': 'application/xml' },
      status: 400,
      detail: /nest/,
    },
  ];
}

/** Rows in every table of the product and of the job queue. */
async function rowCounts(): Promise<Record<string, number>> {
  const { rows: tables } = await server.pool.query<{ name: string }>(
    `select format('%I.%I', table_schema, table_name) as name from information_schema.tables
      where table_type = 'BASE TABLE' and table_schema in ('public', 'pgboss') order by 1`,
  );
  const { rows } = await server.pool.query<{ name: string; count: number }>(
    tables.map((t) => `select '${t.name}' as name, count(*)::int as count from ${t.name}`).join(' union all '),
  );
  return Object.fromEntries(rows.map((r) => [r.name, r.count]));
}

async function send(c: Case): Promise<request.Response> {
  let call = request(server.url)
    [c.method as 'post'](c.url)
    .set({ Cookie: admin.cookie.join('; '), 'X-CSRF-Token': admin.csrf, ...c.headers });
  if (c.raw) call = call.send(c.raw);
  else if (c.body !== undefined) call = call.send(c.body as object);
  return call;
}

/** What is wrong with an answer, or null when it is right. */
function fault(c: Case, response: request.Response): string | null {
  const status = response.status;
  if (status < 400 || status >= 500 || status === 401 || status === 403) return `status ${status}: ${response.text.slice(0, 200)}`;
  if (c.status !== undefined && status !== c.status) return `status ${status}, expected ${c.status}: ${response.text.slice(0, 200)}`;
  if (!/application\/problem\+json/.test(response.headers['content-type'] ?? '')) return `content type ${response.headers['content-type']}`;
  const problem = response.body as { type?: string; title?: string; status?: number; detail?: string; errors?: { pointer: string }[] };
  if (!problem.type || !problem.title || problem.status !== status || !problem.detail) return `not a complete problem: ${response.text}`;
  if (c.detail && !c.detail.test(problem.detail)) return `detail "${problem.detail}" does not match ${c.detail}`;
  if (c.pointer && !problem.errors?.some((e) => c.pointer!.startsWith(e.pointer) || e.pointer.startsWith(c.pointer!)))
    return `errors ${JSON.stringify(problem.errors)} do not point at ${c.pointer}`;
  return null;
}

describe('bad input', () => {
  it('is answered on every route with a 4xx problem that says what is wrong, and changes no row', async () => {
    const cases: Case[] = [];
    for (const [path, operations] of Object.entries(document.paths))
      for (const [method, operation] of Object.entries(operations)) cases.push(...casesFor(path, method, operation));
    cases.push(...specialCases());
    const routesWalked = new Set(cases.filter((c) => writing.has(c.method)).map((c) => `${c.method} ${c.url.split('?')[0]}`));
    const before = await rowCounts();
    const faults: string[] = [];
    for (const c of cases) {
      const problem = fault(c, await send(c));
      if (problem) faults.push(`${c.name}: ${problem}`);
    }
    expect(faults).toEqual([]);
    expect(await rowCounts()).toEqual(before);
    // Every writing route of the document was walked (the document lists 29 of them at the time of writing).
    const writingRoutes = Object.values(document.paths).flatMap((ops) => Object.keys(ops).filter((m) => writing.has(m)));
    expect(writingRoutes.length).toBeGreaterThanOrEqual(29);
    expect(routesWalked.size).toBeGreaterThanOrEqual(writingRoutes.length);
    expect(cases.length).toBeGreaterThan(300);
  });

  it('refuses ids beyond int4 and loosely written ids with the reason, e.g. DELETE /api/tokens/3000000000', async () => {
    for (const [written, detail] of [
      [String(beyondInt4), `An id is at most ${int4Max}`],
      ['0x10', 'Write the id in plain decimal digits (0-9)'],
      ['1e3', 'Write the id in plain decimal digits (0-9)'],
    ] as const) {
      const response = await send({ name: written, method: 'delete', url: `/api/tokens/${written}` });
      expect(response.status).toBe(400);
      expect(response.body.errors).toEqual([{ pointer: '/params/id', detail }]);
    }
  });
});
