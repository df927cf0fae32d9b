import { healthReportSchema } from '@loadwright/contracts';
import type { AppContext } from '../app-context';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { checkHealth } from './health-service';

/** GET /api/health: public by design, so probes and the sign-in page can read it; it holds no data. */
export function healthRoutes({ pool }: AppContext): RouteDefinition[] {
  return [
    defineRoute({
      method: 'get',
      path: '/health',
      access: 'public',
      tag: 'Service',
      summary: 'Database and job-queue status (503 when degraded)',
      response: healthReportSchema,
      handler: async ({ res }) => {
        const report = await checkHealth(pool);
        res.status(report.status === 'ok' ? 200 : 503);
        return report;
      },
    }),
  ];
}
