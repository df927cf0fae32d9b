/**
 * The Express application: security headers, request logging, the declared API routes behind the
 * gatekeeper, problem-details errors, and the built web app with its client-side routes. No listening
 * here, so tests drive it with supertest.
 */
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import compression from 'compression';
import cookieParser from 'cookie-parser';
import express from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { installValidationMessages } from '@loadwright/contracts';
import type { AppContext } from './app-context';
import { apiRoutes } from './api-routes';
import { createGatekeeper } from './auth/gatekeeper';
import { apiNotFound, problemHandler } from './errors/problem-middleware';
import { mountRoutes } from './http/mount-routes';

/** Builds the application around its context. */
export function createApp(context: AppContext): express.Express {
  // Refused input is described in sentences ("Use a number of at least 7"), never in the validator's words.
  installValidationMessages();
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
      strictTransportSecurity: context.secureCookies,
    }),
  );
  app.use(
    pinoHttp({
      logger: context.logger,
      // One short line per request: no headers and no query string, so no cookie, token or link secret reaches the log.
      serializers: {
        req: (req: { method: string; url: string }) => ({ method: req.method, url: req.url.split('?')[0] }),
        res: (res: { statusCode: number }) => ({ status: res.statusCode }),
      },
      customLogLevel: (_req, res, error) => (error || res.statusCode >= 500 ? 'warn' : 'info'),
      customErrorMessage: (_req, res) => `request failed with status ${res.statusCode}`,
    }),
  );
  // gzip (or deflate) for every compressible answer over 1 kB: scripts, styles, JSON, CSV exports.
  app.use(compression());
  app.use(cookieParser());
  app.use(express.json({ limit: '2mb' }));

  const gatekeeper = createGatekeeper({ db: context.db, secret: context.sessionSecret, secureCookies: context.secureCookies });
  const routes = apiRoutes(context);
  app.locals['routes'] = routes; // read by the access-matrix test
  app.use('/api', mountRoutes(routes, gatekeeper), apiNotFound);

  const { webDist } = context;
  if (webDist && existsSync(resolve(webDist, 'index.html'))) {
    app.use(express.static(webDist, { index: false, maxAge: '1h', setHeaders: cacheByName }));
    app.get('/{*splat}', (_req, res) => res.sendFile(resolve(webDist, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } }));
    app.locals['webFallback'] = true;
  }
  app.use(problemHandler);
  return app;
}

/**
 * The build names scripts, styles and fonts after a hash of their content (`main-3KQ7XW2B.js`): such a
 * file never changes under its name, so browsers keep it for a year without asking again. HTML is
 * revalidated every time, so a new build's names are picked up at once; anything else keeps an hour.
 */
export const hashedAssetName = /-[A-Z0-9]{8}\.(?:js|css|woff2?)$/;

/** Sets the cache lifetime of a static file by its name (see hashedAssetName). */
function cacheByName(res: express.Response, path: string): void {
  if (path.endsWith('.html')) res.setHeader('Cache-Control', 'no-cache');
  else if (hashedAssetName.test(path)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
}
