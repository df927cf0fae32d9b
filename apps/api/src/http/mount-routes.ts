/**
 * Mounts declared routes on a router: identify the caller, check access and CSRF, parse the input
 * with the route's schemas, run the handler, and send its result through the response schema (which
 * strips any field the contract does not name, so internals such as hashes can never leak).
 */
import { Router, type Request, type Response } from 'express';
import { z } from 'zod';
import type { Actor } from '@loadwright/audit';
import { authorize } from '../auth/authorize';
import { HttpProblem } from '@loadwright/problems';
import type { RouteDefinition } from './route-table';

/** How the router learns who is calling and whether a write carries its CSRF token. */
export interface Gatekeeper {
  identify(req: Request, res: Response): Promise<Actor>;
  assertCsrf(req: Request, actor: Actor): void;
}

const writeMethods = new Set(['post', 'put', 'patch', 'delete']);

/** A router holding exactly the given routes. */
export function mountRoutes(routes: RouteDefinition[], gatekeeper: Gatekeeper): Router {
  const router = Router();
  for (const route of routes) {
    router[route.method](route.path, async (req, res) => {
      const actor = await gatekeeper.identify(req, res);
      authorize(route.access, actor);
      if (writeMethods.has(route.method)) gatekeeper.assertCsrf(req, actor);
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
  if (!schema) return undefined;
  const result = schema.safeParse(value ?? {});
  if (result.success) return result.data;
  const errors = result.error.issues.map((issue) => ({ pointer: `${pointerPrefix}/${issue.path.join('/')}`, detail: issue.message }));
  throw new HttpProblem('invalidInput', errors.map((e) => `${e.pointer}: ${e.detail}`).join('; '), errors);
}
