/**
 * Every API route is declared here through `defineRoute`: its method, path, who may call it, and the
 * zod schemas of its input and output. Nothing else mounts API routes, so a route without a declared
 * access rule cannot exist (deny by default), and the same declarations feed the OpenAPI document and
 * the access-matrix test.
 */
import type { Permission } from '@loadwright/contracts';
import type { Request, Response } from 'express';
import type { z } from 'zod';
import type { Actor } from '@loadwright/audit';

/** Who may call a route: anyone (`public`) or holders of one permission. */
export type Access = 'public' | Permission;

/** HTTP methods the API uses. */
export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** What a handler receives: parsed input, the caller, and the raw request/response for streams and cookies. */
export interface RouteContext<Params, Query, Body> {
  params: Params;
  query: Query;
  body: Body;
  actor: Actor;
  req: Request;
  res: Response;
}

/** One declared route. Paths use Express syntax relative to /api, e.g. `/people/:id`. */
export interface RouteDefinition<
  P extends z.ZodType = z.ZodType,
  Q extends z.ZodType = z.ZodType,
  B extends z.ZodType = z.ZodType,
  R extends z.ZodType = z.ZodType,
> {
  method: Method;
  path: string;
  access: Access;
  summary: string;
  tag: string;
  params?: P;
  query?: Q;
  body?: B;
  /** Schema of a JSON response; omit for routes that stream files or answer 204. */
  response?: R;
  /** Status of a successful response (default 200, or 204 without a response schema). */
  status?: number;
  /** Extra response media type for file downloads, e.g. text/csv. */
  produces?: string;
  handler: (context: RouteContext<z.infer<P>, z.infer<Q>, z.infer<B>>) => Promise<z.infer<R> | void> | z.infer<R> | void;
}

/** Declares a route with its types inferred from the schemas. */
export function defineRoute<P extends z.ZodType, Q extends z.ZodType, B extends z.ZodType, R extends z.ZodType>(
  definition: RouteDefinition<P, Q, B, R>,
): RouteDefinition {
  return definition as unknown as RouteDefinition;
}
