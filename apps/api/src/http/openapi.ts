/**
 * The OpenAPI 3.1 description of the API, generated from the same route declarations and zod
 * contracts that the server enforces, so it cannot drift from what the server does.
 */
import { OpenAPIRegistry, OpenApiGeneratorV31 } from '@asteasolutions/zod-to-openapi';
import { problemSchema } from '@loadwright/contracts';
import type { RouteDefinition } from './route-table';

/** Express `/people/:id` → OpenAPI `/people/{id}`. */
export function openApiPath(path: string): string {
  return `/api${path.replace(/:(\w+)/g, '{$1}')}`;
}

/** Builds the document for a set of routes. */
export function buildOpenApiDocument(routes: RouteDefinition[], version: string) {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'sessionCookie', { type: 'apiKey', in: 'cookie', name: 'lw_session' });
  registry.registerComponent('securitySchemes', 'bearerToken', {
    type: 'http',
    scheme: 'bearer',
    description: 'An API token created by an admin',
  });
  const problem = { description: 'Problem details (RFC 9457)', content: { 'application/problem+json': { schema: problemSchema } } };
  for (const route of routes) {
    const success = route.status ?? (route.response ? 200 : 204);
    const content = route.response
      ? { 'application/json': { schema: route.response } }
      : route.produces
        ? { [route.produces]: { schema: { type: 'string' as const } } }
        : undefined;
    registry.registerPath({
      method: route.method,
      path: openApiPath(route.path),
      summary: route.summary,
      tags: [route.tag],
      description: route.access === 'public' ? 'Public.' : `Requires the "${route.access}" permission.`,
      security: route.access === 'public' ? [] : [{ sessionCookie: [] }, { bearerToken: [] }],
      request: {
        ...(route.params && { params: route.params as never }),
        ...(route.query && { query: route.query as never }),
        ...(route.body && { body: { content: { 'application/json': { schema: route.body } } } }),
      },
      responses: {
        [success]: { description: 'Success', ...(content && { content }) },
        ...(route.access !== 'public' && { 401: problem, 403: problem }),
        400: problem,
      },
    });
  }
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Loadwright API',
      version,
      description: 'Load forecasts, histories and their status for downstream systems. Send an API token as a bearer token.',
    },
    servers: [{ url: '/' }],
  });
}
