import { Router } from 'express';
import type { AppContext } from '../../context';
import { IngestGate } from '../service/ingest-gate';
import { datasetsRouter } from './datasets';
import { uploadsRouter } from './uploads';

/** Everything under /api/workspaces/:workspaceId/{datasets,ingests,open-datasets}. */
export function datasetsApi(ctx: AppContext): Router {
  const router = Router();
  // One gate per process for every ingest: uploads and open-dataset imports.
  const gate = new IngestGate(ctx.config.LARIAT_INGEST_SLOTS, ctx.config.LARIAT_INGEST_QUEUE);
  router.use(uploadsRouter(ctx, gate));
  router.use(datasetsRouter(ctx, gate));
  return router;
}
