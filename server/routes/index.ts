import { Router } from 'express';
import { authBase } from '../auth/middleware';
import { datasetsApi } from '../datasets/routes/index';
import type { AppContext } from '../context';
import { devOutboxRouter } from '../dev/outbox';
import { fitsRouter } from '../fits/routes';
import { releasesRouter } from '../releases/routes';
import { reviewsRouter } from '../reviews/routes';
import { consumersAdminRouter } from '../consumers/routes';
import { exportsRouter } from '../exports/routes';
import { authRouter } from './auth';
import { invitationsRouter } from './invitations';
import { workspacesRouter } from './workspaces';

/** Mounts each area's router. Each area adds one line here. */
export function apiRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/health', (_req, res) => {
    res.json({ ok: true });
  });
  router.use(authBase(ctx)); // first: CSRF for every state-changing request, and the context for auth middleware
  router.use(authRouter(ctx));
  router.use(workspacesRouter(ctx));
  router.use(invitationsRouter(ctx));
  router.use(devOutboxRouter(ctx));
  router.use(datasetsApi(ctx));
  router.use(fitsRouter(ctx));
  router.use(reviewsRouter(ctx));
  router.use(releasesRouter(ctx));
  router.use(exportsRouter(ctx));
  router.use(consumersAdminRouter(ctx));
  return router;
}
