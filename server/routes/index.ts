import { Router } from 'express';
import type { AppContext } from '../context';

/** Mounts each area's router. Each area adds one line here. */
export function apiRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/health', (_req, res) => {
    res.json({ ok: true });
  });
  void ctx;
  return router;
}
