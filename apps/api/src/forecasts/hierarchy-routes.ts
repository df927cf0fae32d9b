/**
 * Coherence across the hierarchy (read) and reconciliation of a parent's hierarchy (planners and admins), and
 * the temperatures a forecast assumed (read).
 */
import {
  assumedTemperaturesSchema,
  coherenceQuerySchema,
  hierarchyCoherenceSchema,
  reconcileRequestSchema,
  reconciliationResultSchema,
  idParamsSchema,
} from '@loadwright/contracts';
import { assumedTemperatures, hierarchyCoherence, reconcileHierarchy } from '@loadwright/forecasts';
import type { AppContext } from '../app-context';
import { clientAddress } from '../auth/client-address';
import { defineRoute, type RouteDefinition } from '../http/route-table';

const idParams = idParamsSchema;
const tag = 'Forecasts';

/** The routes of hierarchy coherence and reconciliation. */
export function hierarchyRoutes({ db }: AppContext): RouteDefinition[] {
  return [
    defineRoute({
      method: 'get',
      path: '/series/:id/assumed-temperatures',
      access: 'data.read',
      tag,
      summary:
        'The temperatures the current forecast assumed: observed before its origin, then observed or the forecast issue its fit used',
      params: idParams,
      response: assumedTemperaturesSchema,
      handler: ({ params }) => assumedTemperatures(db, params.id),
    }),
    defineRoute({
      method: 'get',
      path: '/series/:id/coherence',
      access: 'data.read',
      tag,
      summary: "A parent's forecast against the sum of its children (and the reconciled remainder), hour by hour",
      params: idParams,
      query: coherenceQuerySchema,
      response: hierarchyCoherenceSchema,
      handler: ({ params, query }) => hierarchyCoherence(db, params.id, query.state),
    }),
    defineRoute({
      method: 'post',
      path: '/series/:id/reconciliations',
      access: 'forecasts.approve',
      tag,
      summary:
        'Reconcile the current drafts of a series and everything under it (bottom-up, top-down or minimum trace) into one coherent set of drafts',
      params: idParams,
      body: reconcileRequestSchema,
      response: reconciliationResultSchema,
      status: 201,
      handler: ({ params, body, actor, req }) => reconcileHierarchy(db, params.id, body, { actor, ip: clientAddress(req) }),
    }),
  ];
}
