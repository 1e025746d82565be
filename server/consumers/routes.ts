/**
 * Admin routes for consumers (session + CSRF like every workspace route; admins only):
 *   GET  /api/workspaces/:workspaceId/keys                     keys (never the keys themselves)
 *   POST /api/workspaces/:workspaceId/keys                     -> 201 with the key, shown once
 *   POST /api/workspaces/:workspaceId/keys/:keyId/revoke
 *   GET  /api/workspaces/:workspaceId/webhooks
 *   POST /api/workspaces/:workspaceId/webhooks                 -> 201 with the signing secret, shown once
 *   DELETE /api/workspaces/:workspaceId/webhooks/:webhookId    stops deliveries; history stays
 *   GET  /api/workspaces/:workspaceId/webhooks/:webhookId/deliveries
 */
import type { Request } from 'express';
import { Router } from 'express';
import { requireWorkspaceRole, sessionUser, workspaceMembership } from '../auth/middleware';
import type { AppContext } from '../context';
import { notFound } from '../http/errors';
import { createKey, listKeys, revokeKey, type Actor } from './keys/service';
import { createWebhook, listDeliveries, listWebhooks, removeWebhook } from './webhooks/service';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function idParam(req: Request, name: 'keyId' | 'webhookId'): string {
  const id = req.params[name];
  if (typeof id !== 'string' || !UUID.test(id)) throw notFound(name === 'keyId' ? 'No such key in this workspace.' : 'No such webhook in this workspace.');
  return id;
}

function actor(req: Request): Actor {
  const user = sessionUser(req);
  return { userId: user.id, label: user.email, ip: req.ip ?? null };
}

export function consumersAdminRouter(ctx: AppContext): Router {
  const router = Router();
  const admin = requireWorkspaceRole('admin');
  const base = '/workspaces/:workspaceId';
  const ws = (req: Request) => workspaceMembership(req).workspaceId;
  router.get(`${base}/keys`, admin, async (req, res) => {
    res.json(await listKeys(ctx.db, ws(req)));
  });
  router.post(`${base}/keys`, admin, async (req, res) => {
    res.set('Cache-Control', 'no-store').status(201).json(await createKey(ctx.db, ws(req), actor(req), req.body));
  });
  router.post(`${base}/keys/:keyId/revoke`, admin, async (req, res) => {
    res.json(await revokeKey(ctx.db, ws(req), actor(req), idParam(req, 'keyId')));
  });
  router.get(`${base}/webhooks`, admin, async (req, res) => {
    res.json(await listWebhooks(ctx.db, ws(req)));
  });
  router.post(`${base}/webhooks`, admin, async (req, res) => {
    res.set('Cache-Control', 'no-store').status(201).json(await createWebhook(ctx, ws(req), actor(req), req.body));
  });
  router.delete(`${base}/webhooks/:webhookId`, admin, async (req, res) => {
    await removeWebhook(ctx.db, ws(req), actor(req), idParam(req, 'webhookId'));
    res.status(204).end();
  });
  router.get(`${base}/webhooks/:webhookId/deliveries`, admin, async (req, res) => {
    res.json(await listDeliveries(ctx.db, ws(req), idParam(req, 'webhookId')));
  });
  return router;
}
