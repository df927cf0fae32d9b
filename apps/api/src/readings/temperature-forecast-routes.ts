/**
 * Temperature forecast issues of a weather station: pushed by a provider's system with a token (or a steward),
 * or uploaded as a CSV file (received by POST /api/uploads, then read here as issues); listed with their hours
 * for the station page. `:series` is the station's id or key.
 */
import {
  idParamsSchema,
  pushTemperatureForecastSchema,
  temperatureForecastFileResultSchema,
  temperatureForecastFileSchema,
  temperatureForecastHoursQuerySchema,
  temperatureForecastHoursSchema,
  temperatureForecastIssueListSchema,
  temperatureForecastIssueSchema,
} from '@loadwright/contracts';
import type { Series } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';
import {
  listTemperatureForecasts,
  storeTemperatureForecast,
  storeTemperatureForecastFile,
  temperatureForecastHours,
} from '@loadwright/readings';
import { findSeriesByRef } from '@loadwright/series';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import { clientAddress } from '../auth/client-address';
import { defineRoute, type RouteDefinition } from '../http/route-table';

const seriesParams = z.object({ series: z.string().trim().min(1).max(64) });
const tag = 'Readings';

/** Temperature forecast routes. */
export function temperatureForecastRoutes({ db }: AppContext): RouteDefinition[] {
  const stationOf = async (ref: string): Promise<Series> => {
    const series = await findSeriesByRef(db, ref);
    if (!series) throw new HttpProblem('notFound', `No series "${ref}".`);
    return series;
  };
  return [
    defineRoute({
      method: 'post',
      path: '/series/:series/temperature-forecasts',
      access: 'data.upload',
      tag,
      summary: 'Store one temperature forecast issue of a station (°C or °F, converted once); issues are kept whole, never overwritten',
      params: seriesParams,
      body: pushTemperatureForecastSchema,
      response: temperatureForecastIssueSchema,
      status: 201,
      handler: async ({ params, body, actor, req }) =>
        storeTemperatureForecast(db, await stationOf(params.series), body, { actor, ip: clientAddress(req) }),
    }),
    defineRoute({
      method: 'get',
      path: '/series/:series/temperature-forecasts',
      access: 'data.read',
      tag,
      summary: 'The temperature forecast issues of a station, newest first: issue time, valid hours, range',
      params: seriesParams,
      response: temperatureForecastIssueListSchema,
      handler: async ({ params }) => listTemperatureForecasts(db, await stationOf(params.series)),
    }),
    defineRoute({
      method: 'get',
      path: '/series/:series/temperature-forecast-hours',
      access: 'data.read',
      tag,
      summary: 'The valid hours of one temperature forecast issue of a station, in its unit',
      params: seriesParams,
      query: temperatureForecastHoursQuerySchema,
      response: temperatureForecastHoursSchema,
      handler: async ({ params, query }) => temperatureForecastHours(db, await stationOf(params.series), query.issuedAt),
    }),
    defineRoute({
      method: 'post',
      path: '/uploads/:id/temperature-forecast',
      access: 'data.upload',
      tag: 'Uploads',
      summary:
        'Read a received CSV file as temperature forecast issues (issue time, valid hour, temperature columns; °C or °F converted once): check only, or store every issue all or nothing',
      params: idParamsSchema,
      body: temperatureForecastFileSchema,
      response: temperatureForecastFileResultSchema,
      handler: ({ params, body, actor, req }) => storeTemperatureForecastFile(db, params.id, body, { actor, ip: clientAddress(req) }),
    }),
  ];
}
