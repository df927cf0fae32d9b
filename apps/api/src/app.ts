/**
 * The Express application: security headers, request logging, the API routers, problem-details
 * errors, and the built web app with its client-side routes. No listening here, so tests can drive it
 * with supertest.
 */
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import express from 'express';
import helmet from 'helmet';
import type { Pool } from 'pg';
import { pinoHttp } from 'pino-http';
import type { Logger } from 'pino';
import { healthRoutes } from './health/health-routes';
import { apiNotFound, problemHandler } from './errors/problem-middleware';

/** What the application needs from the process that hosts it. */
export interface AppDependencies {
  pool: Pool;
  logger: Logger;
  /** Folder of the built web app (index.html and assets); absent in API-only tests. */
  webDist?: string;
}

/** Builds the application around its dependencies. */
export function createApp({ pool, logger, webDist }: AppDependencies): express.Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          upgradeInsecureRequests: null,
        },
      },
    }),
  );
  app.use(
    pinoHttp({
      logger,
      // One short line per request: no headers, so no cookie or token ever reaches the log.
      serializers: {
        req: (req: { method: string; url: string }) => ({ method: req.method, url: req.url.split('?')[0] }),
        res: (res: { statusCode: number }) => ({ status: res.statusCode }),
      },
      customLogLevel: (_req, res, error) => (error || res.statusCode >= 500 ? 'warn' : 'info'),
      customErrorMessage: (_req, res) => `request failed with status ${res.statusCode}`,
    }),
  );
  app.use(express.json({ limit: '2mb' }));

  const api = express.Router();
  api.use(healthRoutes(pool));
  api.use(apiNotFound);
  app.use('/api', api);

  if (webDist && existsSync(resolve(webDist, 'index.html'))) {
    app.use(express.static(webDist, { index: false, maxAge: '1h', setHeaders: noCacheForIndex }));
    app.get('/{*splat}', (_req, res) => res.sendFile(resolve(webDist, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } }));
  }
  app.use(problemHandler);
  return app;
}

function noCacheForIndex(res: express.Response, path: string): void {
  if (path.endsWith('.html')) res.setHeader('Cache-Control', 'no-cache');
}
