/**
 * Forecast review (read), adjustments and approval (planners and admins), and the hand-on exports
 * (read, tokens included).
 */
import {
  approvalPreviewRequestSchema,
  approvalPreviewSchema,
  approvalResultSchema,
  bulkApprovalRequestSchema,
  createAdjustmentRequestSchema,
  forecastAdjustmentSchema,
  forecastExportQuerySchema,
  forecastReviewSchema,
  forecastVersionDetailSchema,
  forecastVersionPageSchema,
  forecastVersionsQuerySchema,
  idParamSchema,
  idParamsSchema,
} from '@loadwright/contracts';
import type { AppContext } from '../app-context';
import { clientAddress } from '../auth/client-address';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { addAdjustment, removeAdjustment } from '@loadwright/forecasts';
import { previewApprovals } from '@loadwright/forecasts';
import { approveVersions } from '@loadwright/forecasts';
import { streamForecastCsv, streamForecastJson } from './forecast-export';
import { createReviewResponder } from './review-response';
import { versionDetail, versionPage } from '@loadwright/forecasts';

const idParams = idParamsSchema;
const adjustmentParams = idParams.extend({ adjustmentId: idParamSchema });
const tag = 'Forecasts';

/** The routes of forecast review, approval and export. */
export function forecastRoutes({ db, pool }: AppContext): RouteDefinition[] {
  const sendReview = createReviewResponder(db, pool);
  return [
    defineRoute({
      method: 'get',
      path: '/series/:id/forecast',
      access: 'data.read',
      tag,
      summary:
        'Review a series: current draft and approved version with adjusted numbers and local daily peaks, actuals so far, and their differences',
      params: idParams,
      response: forecastReviewSchema,
      // Sent from a store of computed reviews with an ETag (304 when unchanged); see review-response.ts.
      handler: ({ params, req, res }) => sendReview(params.id, req, res),
    }),
    defineRoute({
      method: 'get',
      path: '/series/:id/forecast-versions',
      access: 'data.read',
      tag,
      summary: 'Version history of a series, newest first; `before` continues from the last id of a page',
      params: idParams,
      query: forecastVersionsQuerySchema,
      response: forecastVersionPageSchema,
      handler: ({ params, query }) => versionPage(db, params.id, query),
    }),
    defineRoute({
      method: 'get',
      path: '/forecast-versions/:id',
      access: 'data.read',
      tag,
      summary: 'One forecast version in full: fit, adjustments, points (model and adjusted) and local daily peaks',
      params: idParams,
      response: forecastVersionDetailSchema,
      handler: ({ params }) => versionDetail(db, params.id),
    }),
    defineRoute({
      method: 'post',
      path: '/forecast-versions/:id/adjustments',
      access: 'forecasts.approve',
      tag,
      summary: 'Adjust a period of a draft (shift or scale, with a reason); the model numbers stay as they are',
      params: idParams,
      body: createAdjustmentRequestSchema,
      response: forecastAdjustmentSchema,
      status: 201,
      handler: ({ params, body, actor, req }) => addAdjustment(db, params.id, body, { actor, ip: clientAddress(req) }),
    }),
    defineRoute({
      method: 'delete',
      path: '/forecast-versions/:id/adjustments/:adjustmentId',
      access: 'forecasts.approve',
      tag,
      summary: 'Remove an adjustment from a draft',
      params: adjustmentParams,
      handler: ({ params, actor, req }) => removeAdjustment(db, params.id, params.adjustmentId, { actor, ip: clientAddress(req) }),
    }),
    defineRoute({
      method: 'post',
      path: '/forecast-versions/:id/approve',
      access: 'forecasts.approve',
      tag,
      summary: 'Approve a draft; the previously approved version of the series is superseded in the same transaction',
      params: idParams,
      response: approvalResultSchema,
      handler: ({ params, actor, req }) => approveVersions(db, [params.id], { actor, ip: clientAddress(req) }, { single: true }),
    }),
    defineRoute({
      method: 'post',
      path: '/forecast-approvals/preview',
      access: 'forecasts.approve',
      tag,
      summary:
        'What approving the current drafts of some series or of a group would change: peaks and energy against the approved versions',
      body: approvalPreviewRequestSchema,
      response: approvalPreviewSchema,
      handler: ({ body }) => previewApprovals(db, body),
    }),
    defineRoute({
      method: 'post',
      path: '/forecast-approvals',
      access: 'forecasts.approve',
      tag,
      summary: 'Approve several drafts in one transaction, all or none; stale versions are listed in the conflict',
      body: bulkApprovalRequestSchema,
      response: approvalResultSchema,
      handler: ({ body, actor, req }) =>
        approveVersions(db, body.versionIds, { actor, ip: clientAddress(req) }, { includeStale: body.includeStale }),
    }),
    defineRoute({
      method: 'get',
      path: '/exports/forecasts.csv',
      access: 'data.read',
      tag,
      summary:
        'Approved forecasts as CSV (streamed): one series, a group or the whole system, in UTC or a chosen time zone, with explicit interval columns',
      query: forecastExportQuerySchema,
      produces: 'text/csv',
      status: 200,
      handler: ({ query, res }) => streamForecastCsv(db, res, query),
    }),
    defineRoute({
      method: 'get',
      path: '/exports/forecasts',
      access: 'data.read',
      tag,
      summary: 'Approved forecasts as JSON (streamed, shape of forecastExportSchema): one series, a group or the whole system',
      query: forecastExportQuerySchema,
      produces: 'application/json',
      status: 200,
      handler: ({ query, res }) => streamForecastJson(db, res, query),
    }),
  ];
}
