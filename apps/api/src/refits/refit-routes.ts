/** Refit runs: start one now (POST /api/refits) and follow them (GET /api/refits, /current, /:id). */
import {
  currentRefitSchema,
  refitRunDetailSchema,
  refitRunListQuerySchema,
  refitRunListSchema,
  refitRunSummarySchema,
  startRefitRequestSchema,
  idParamsSchema,
} from '@loadwright/contracts';
import type { AppContext } from '../app-context';
import { clientAddress } from '../auth/client-address';
import { HttpProblem } from '@loadwright/problems';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { createJobInserter, refitQueueReady } from '@loadwright/refits';
import { RefitScopeError, startRefitRun } from '@loadwright/refits';
import { currentRun, listRuns, runDetail } from '@loadwright/refits';

/** The routes under /api/refits. */
export function refitRoutes({ pool }: AppContext): RouteDefinition[] {
  const insertJobs = createJobInserter();
  return [
    defineRoute({
      method: 'get',
      path: '/refits',
      access: 'data.read',
      tag: 'Refits',
      summary: 'Refit runs, newest first, with series counts by status',
      query: refitRunListQuerySchema,
      response: refitRunListSchema,
      handler: async ({ query }) => ({ runs: await listRuns(pool, query.limit) }),
    }),
    defineRoute({
      method: 'get',
      path: '/refits/current',
      access: 'data.read',
      tag: 'Refits',
      summary: 'The run in progress, if any (cheap enough to poll every second or two)',
      response: currentRefitSchema,
      handler: async () => ({ run: await currentRun(pool) }),
    }),
    defineRoute({
      method: 'get',
      path: '/refits/:id',
      access: 'data.read',
      tag: 'Refits',
      summary: 'One run with every series: status, attempts, error, phase times',
      params: idParamsSchema,
      response: refitRunDetailSchema,
      handler: async ({ params }) => {
        const run = await runDetail(pool, params.id);
        if (!run) throw new HttpProblem('notFound', `No refit run with id ${params.id}.`);
        return run;
      },
    }),
    defineRoute({
      method: 'post',
      path: '/refits',
      access: 'models.edit',
      tag: 'Refits',
      summary: 'Refit one series, a group (a series and everything below it) or all active series now',
      body: startRefitRequestSchema,
      response: refitRunSummarySchema,
      status: 202,
      handler: async ({ body, actor, req }) => {
        if (!(await refitQueueReady(pool)))
          throw new HttpProblem('unavailable', 'The job queue is not ready: no worker has started against this database yet.');
        let started;
        try {
          started = await startRefitRun(pool, insertJobs, {
            trigger: 'manual',
            scope: body.scope,
            requestedById: actor.kind === 'user' ? actor.userId : null,
            caller: { actor, ip: clientAddress(req) },
          });
        } catch (error) {
          if (error instanceof RefitScopeError) throw new HttpProblem(error.kind, error.message);
          throw error;
        }
        if (!started) throw new HttpProblem('conflict', 'The run could not be created.');
        const [summary] = await listRunsById(started.runId);
        return summary!;
      },
    }),
  ];

  /** The summary of one run. */
  async function listRunsById(runId: number) {
    const detail = await runDetail(pool, runId);
    if (!detail) return [];
    const { series: _series, ...summary } = detail;
    return [summary];
  }
}
