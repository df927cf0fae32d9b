/** Every API route of the product, in one list: the router, the OpenAPI document and the access tests read it. */
import { z } from 'zod';
import type { AppContext } from './app-context';
import { auditRoutes } from './audit/audit-routes';
import { authRoutes } from './auth/auth-routes';
import { forecastRoutes } from './forecasts/forecast-routes';
import { hierarchyRoutes } from './forecasts/hierarchy-routes';
import { temperatureScenarioRoutes } from './forecasts/temperature-scenario-routes';
import { healthRoutes } from './health/health-routes';
import { repeatedHourRoutes } from './intake/repeated-hour-routes';
import { uploadRoutes } from './intake/upload-routes';
import { buildOpenApiDocument } from './http/openapi';
import { defineRoute, type RouteDefinition } from './http/route-table';
import { outboxRoutes } from './outbox/outbox-routes';
import { peopleRoutes } from './people/people-routes';
import { readingsRoutes } from './readings/readings-routes';
import { temperatureForecastRoutes } from './readings/temperature-forecast-routes';
import { seriesRoutes } from './series/series-routes';
import { tokenRoutes } from './tokens/token-routes';
import { modelRoutes } from './models/model-routes';
import { refitRoutes } from './refits/refit-routes';
import { settingsTrialRoutes } from './models/settings-trial-routes';
import { organisationRoutes } from './organisation/organisation-routes';
import { missesRoutes } from './misses/misses-routes';
import { accuracyRoutes } from './accuracy/accuracy-routes';

const version = process.env['npm_package_version'] ?? '0.1.0';

/** All routes, including the one that describes them. */
export function apiRoutes(context: AppContext): RouteDefinition[] {
  const routes = [
    ...healthRoutes(context),
    ...authRoutes(context),
    ...peopleRoutes(context),
    ...tokenRoutes(context),
    ...auditRoutes(context),
    ...outboxRoutes(context),
  ];
  routes.push(...forecastRoutes(context));
  routes.push(...hierarchyRoutes(context), ...temperatureScenarioRoutes(context));
  routes.push(...modelRoutes(context), ...refitRoutes(context), ...settingsTrialRoutes(context));
  routes.push(...seriesRoutes(context), ...readingsRoutes(context));
  routes.push(...temperatureForecastRoutes(context));
  routes.push(...uploadRoutes(context), ...repeatedHourRoutes(context));
  routes.push(...organisationRoutes(context));
  routes.push(...missesRoutes(context));
  routes.push(...accuracyRoutes(context));
  let document: unknown;
  routes.push(
    defineRoute({
      method: 'get',
      path: '/openapi.json',
      access: 'public',
      tag: 'Service',
      summary: 'This API, described in OpenAPI 3.1',
      response: z.record(z.string(), z.unknown()),
      handler: () => (document ??= buildOpenApiDocument(routes, version)) as Record<string, unknown>,
    }),
  );
  return routes;
}
