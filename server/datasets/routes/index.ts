import { Router } from 'express';
import type { AppContext } from '../../context';
import { datasetsRouter } from './datasets';
import { uploadsRouter } from './uploads';

/** Everything under /api/workspaces/:workspaceId/{datasets,ingests,open-datasets}. */
export function datasetsApi(ctx: AppContext): Router {
  const router = Router();
  router.use(uploadsRouter(ctx));
  router.use(datasetsRouter(ctx));
  return router;
}
