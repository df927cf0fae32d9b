/** The routes under /api/series: the catalogue table, one series, and the steward's edits. */
import {
  createSeriesRequestSchema,
  seriesDetailSchema,
  seriesListQuerySchema,
  seriesPageSchema,
  updateSeriesRequestSchema,
  idParamsSchema,
} from '@loadwright/contracts';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import { clientAddress } from '../auth/client-address';
import { HttpProblem } from '@loadwright/problems';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { findSeriesByRef } from '@loadwright/series';
import { archiveSeries, createSeries, getSeriesDetail, listSeries, restoreSeries, updateSeries } from '@loadwright/series';

const idParams = idParamsSchema;

/** Catalogue routes. */
export function seriesRoutes({ db }: AppContext): RouteDefinition[] {
  return [
    defineRoute({
      method: 'get',
      path: '/series',
      access: 'data.read',
      tag: 'Series',
      summary: 'The series catalogue: filter by kind, level, parent (with descendants), text and archived; sort and page',
      query: seriesListQuerySchema,
      response: seriesPageSchema,
      handler: ({ query }) => listSeries(db, query),
    }),
    defineRoute({
      method: 'get',
      path: '/series/:id',
      access: 'data.read',
      tag: 'Series',
      summary: 'One series (by id or key) with its parent chain, children, linked station and reading counts by quality flag',
      params: z.object({ id: z.string().trim().min(1).max(64) }),
      response: seriesDetailSchema,
      handler: async ({ params }) => {
        const found = await findSeriesByRef(db, params.id);
        if (!found) throw new HttpProblem('notFound', `No series "${params.id}".`);
        return getSeriesDetail(db, found.id);
      },
    }),
    defineRoute({
      method: 'post',
      path: '/series',
      access: 'series.edit',
      tag: 'Series',
      summary: 'Add a series to the catalogue',
      body: createSeriesRequestSchema,
      response: seriesDetailSchema,
      status: 201,
      handler: ({ body, actor, req }) => createSeries(db, body, { actor, ip: clientAddress(req) }),
    }),
    defineRoute({
      method: 'patch',
      path: '/series/:id',
      access: 'series.edit',
      tag: 'Series',
      summary: 'Change a series; unit and interval are fixed once readings are stored',
      params: idParams,
      body: updateSeriesRequestSchema,
      response: seriesDetailSchema,
      handler: ({ params, body, actor, req }) => updateSeries(db, params.id, body, { actor, ip: clientAddress(req) }),
    }),
    defineRoute({
      method: 'post',
      path: '/series/:id/archive',
      access: 'series.edit',
      tag: 'Series',
      summary: 'Archive a series: hidden from the catalogue by default and never refit',
      params: idParams,
      response: seriesDetailSchema,
      handler: ({ params, actor, req }) => archiveSeries(db, params.id, { actor, ip: clientAddress(req) }),
    }),
    defineRoute({
      method: 'post',
      path: '/series/:id/restore',
      access: 'series.edit',
      tag: 'Series',
      summary: 'Bring an archived series back',
      params: idParams,
      response: seriesDetailSchema,
      handler: ({ params, actor, req }) => restoreSeries(db, params.id, { actor, ip: clientAddress(req) }),
    }),
  ];
}
