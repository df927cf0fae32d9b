import { Router } from 'express';
import type { Pool } from 'pg';
import { checkHealth } from './health-service';

/** GET /api/health: public by design, so probes and the sign-in page can read it; it holds no data. */
export function healthRoutes(pool: Pool): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    const report = await checkHealth(pool);
    res.status(report.status === 'ok' ? 200 : 503).json(report);
  });
  return router;
}
