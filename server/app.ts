import fs from 'node:fs';
import path from 'node:path';
import cookieParser from 'cookie-parser';
import express from 'express';
import type { AppContext } from './context';
import { errorHandler, notFound } from './http/errors';
import { apiRouter } from './routes/index';
import { consumerApiRouter } from './consumers/api/routes';
import { securityHeaders } from './security/headers';

/** The Express app: JSON API under /api, and the built client (dist/client) for everything else. */
export function createApp(ctx: AppContext): express.Express {
  const app = express();
  app.disable('x-powered-by');
  // Behind a proxy, req.ip (rate limits) and req.protocol come from X-Forwarded-* only for the hops configured.
  app.set('trust proxy', ctx.config.trustProxy);
  app.use(securityHeaders(ctx.config));
  app.use(cookieParser());
  // The consumer API (key-authenticated, own body limits) before the session API's JSON parser.
  app.use('/api/v1', consumerApiRouter(ctx));
  app.use('/api', express.json({ limit: '1mb', strict: true }), apiRouter(ctx));
  app.use('/api', (_req, _res, next) => next(notFound('No such API route.')));

  const clientDir = path.resolve('dist/client');
  if (ctx.config.LARIAT_SERVE_CLIENT === '1' && fs.existsSync(clientDir)) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // Client-side routes: every other GET gets the app shell; the client shows its own 404 page.
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(path.join(clientDir, 'index.html')));
  }
  app.use(errorHandler);
  return app;
}
