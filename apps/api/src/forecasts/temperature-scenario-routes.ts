/** Weather scenarios of a load series' forecast (read): hotter, colder and past years' weather re-run through its model. */
import { idParamsSchema, temperatureScenariosQuerySchema, temperatureScenariosSchema } from '@loadwright/contracts';
import { temperatureScenarios } from '@loadwright/forecasts';
import type { AppContext } from '../app-context';
import { defineRoute, type RouteDefinition } from '../http/route-table';

/** The weather scenario route. */
export function temperatureScenarioRoutes({ db }: AppContext): RouteDefinition[] {
  return [
    defineRoute({
      method: 'get',
      path: '/series/:id/temperature-scenarios',
      access: 'data.read',
      tag: 'Forecasts',
      summary:
        "How the current forecast and its daily peaks move if the week runs `shift` degrees hotter or colder, or brings past years' weather of the same weeks",
      params: idParamsSchema,
      query: temperatureScenariosQuerySchema,
      response: temperatureScenariosSchema,
      handler: ({ params, query }) => temperatureScenarios(db, params.id, query.shift),
    }),
  ];
}
