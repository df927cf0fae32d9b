/**
 * Mounts declared routes on a router: identify the caller, check access and CSRF, refuse text that
 * cannot be stored, parse the input with the route's schemas, run the handler, and send its result
 * through the response schema (which strips any field the contract does not name, so internals such
 * as hashes can never leak).
 */
import { Router, type Request, type Response } from 'express';
import { z } from 'zod';
import { unstorableTextReason } from '@loadwright/contracts';
import type { Actor } from '@loadwright/audit';
import { authorize } from '../auth/authorize';
import { HttpProblem } from '@loadwright/problems';
import type { RouteDefinition } from './route-table';

/** How the router learns who is calling and whether a write carries its CSRF token. */
export interface Gatekeeper {
  identify(req: Request, res: Response): Promise<Actor>;
  assertCsrf(req: Request, actor: Actor): void;
  /** Writes a refused call (401, 403, CSRF) to the audit log, folding repeats. */
  recordRefusal(req: Request, actor: Actor, problem: HttpProblem, route: Pick<RouteDefinition, 'method' | 'path'>): Promise<void>;
}

const writeMethods = new Set(['post', 'put', 'patch', 'delete']);

/** A router holding exactly the given routes. */
export function mountRoutes(routes: RouteDefinition[], gatekeeper: Gatekeeper): Router {
  const router = Router();
  // API answers name people, tokens, sessions, mail and audit entries: no shared or browser cache may
  // keep them unless a route says otherwise (it may set its own Cache-Control).
  router.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  for (const route of routes) {
    router[route.method](route.path, async (req, res) => {
      const actor = await gatekeeper.identify(req, res);
      try {
        authorize(route.access, actor);
        if (writeMethods.has(route.method)) gatekeeper.assertCsrf(req, actor);
      } catch (error) {
        // The refusal is answered even if its audit entry cannot be written (that failure is logged).
        if (error instanceof HttpProblem)
          await gatekeeper
            .recordRefusal(req, actor, error, route)
            .catch((auditError: unknown) => req.log?.error({ err: auditError }, 'could not audit a refused call'));
        throw error;
      }
      const params = parseInput(route.params, req.params, '/params');
      const query = parseInput(route.query, req.query, '/query');
      const body = parseInput(route.body, req.body, '');
      const result = await route.handler({ params, query, body, actor, req, res });
      if (res.headersSent) return;
      if (route.response) res.status(route.status ?? res.statusCode).json(route.response.parse(result));
      else res.status(route.status ?? 204).end();
    });
  }
  return router;
}

function parseInput(schema: z.ZodType | undefined, value: unknown, pointerPrefix: string): unknown {
  const unstorable = unstorableTexts(value, pointerPrefix);
  if (unstorable.length > 0) throw invalidInput(unstorable);
  if (!schema) return undefined;
  const result = schema.safeParse(value ?? {});
  if (result.success) return result.data;
  return throwIssues(result.error.issues, pointerPrefix);
}

function throwIssues(issues: z.core.$ZodIssue[], pointerPrefix: string): never {
  throw invalidInput(issues.map((issue) => ({ pointer: `${pointerPrefix}/${issue.path.join('/')}`, detail: issue.message })));
}

function invalidInput(errors: { pointer: string; detail: string }[]): HttpProblem {
  return new HttpProblem('invalidInput', errors.map((e) => `${e.pointer}: ${e.detail}`).join('; '), errors);
}

/**
 * Every string (and object key) in the input that PostgreSQL could not store, with its JSON pointer.
 * Checked for every route before its schema, so no text field anywhere can carry a NUL or a lone
 * surrogate to the database, whatever its own schema says.
 */
function unstorableTexts(value: unknown, pointer: string, found: { pointer: string; detail: string }[] = []) {
  if (found.length >= 20) return found;
  if (typeof value === 'string') {
    const reason = unstorableTextReason(value);
    if (reason) found.push({ pointer, detail: reason });
  } else if (Array.isArray(value)) {
    value.forEach((item, index) => unstorableTexts(item, `${pointer}/${index}`, found));
  } else if (value !== null && typeof value === 'object') {
    for (const [key, item] of Object.entries(value)) {
      const keyReason = unstorableTextReason(key);
      if (keyReason) found.push({ pointer: `${pointer}/${escapePointer(key)}`, detail: `The field name: ${keyReason}` });
      else unstorableTexts(item, `${pointer}/${escapePointer(key)}`, found);
    }
  }
  return found;
}

/** RFC 6901 escaping of one pointer segment. */
function escapePointer(segment: string): string {
  return segment.replace(/~/g, '~0').replace(/\//g, '~1');
}
