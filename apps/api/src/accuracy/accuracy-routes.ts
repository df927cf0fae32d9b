/** Forecast accuracy (read): one series' report for its page, and the summary across series for the Overview. */
import { accuracyOverviewSchema, accuracyQuerySchema, idParamsSchema, seriesAccuracySchema } from '@loadwright/contracts';
import { accuracyOverview, seriesAccuracy } from '@loadwright/accuracy';
import type { AppContext } from '../app-context';
import { defineRoute, type RouteDefinition } from '../http/route-table';

const tag = 'Accuracy';

/** The routes under /api/series/:id/accuracy and /api/accuracy. */
export function accuracyRoutes({ db }: AppContext): RouteDefinition[] {
  return [
    defineRoute({
      method: 'get',
      path: '/series/:id/accuracy',
      access: 'data.read',
      tag,
      summary:
        'Accuracy of every version of a series against actuals: overall, by horizon, day type, band kind and version, daily peaks and the recent days',
      params: idParamsSchema,
      query: accuracyQuerySchema,
      response: seriesAccuracySchema,
      handler: ({ params, query }) => seriesAccuracy(db, params.id, query.days),
    }),
    defineRoute({
      method: 'get',
      path: '/accuracy/overview',
      access: 'data.read',
      tag,
      summary: 'Skill against seasonal naive across series and the series that miss most, for the Overview',
      query: accuracyQuerySchema,
      response: accuracyOverviewSchema,
      handler: ({ query }) => accuracyOverview(db, query.days),
    }),
  ];
}
