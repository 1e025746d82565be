/**
 * Releases and the audit log under /api/workspaces/:workspaceId. Admins and analysts release and
 * restore (reviewers and viewers: 403; the service requires an approved fit); every member reads
 * releases; only admins read and export the audit log.
 */
import type { Request } from 'express';
import { Router } from 'express';
import { anyMember, requireWorkspaceRole, workspaceMembership } from '../auth/middleware';
import { auditCsv, listAuditEvents, parseAuditQuery } from '../audit/read';
import type { AppContext } from '../context';
import { contentDisposition } from '../datasets/routes/params';
import { actorOf, idParam } from '../reviews/routes';
import { listReleases, listReleasesOfModel, publishRelease, restoreRelease } from './service';

export function releasesRouter(ctx: AppContext): Router {
  const router = Router();
  const base = '/workspaces/:workspaceId';
  const ws = (req: Request) => workspaceMembership(req).workspaceId;
  const releasers = requireWorkspaceRole('admin', 'analyst');
  const admins = requireWorkspaceRole('admin');

  router.get(`${base}/releases`, anyMember, async (req, res) => {
    res.json(await listReleases(ctx, ws(req)));
  });
  router.get(`${base}/models/:modelId/releases`, anyMember, async (req, res) => {
    res.json(await listReleasesOfModel(ctx, ws(req), idParam(req, 'modelId', 'model')));
  });
  router.post(`${base}/models/:modelId/releases`, releasers, async (req, res) => {
    res.status(201).json(await publishRelease(ctx, ws(req), idParam(req, 'modelId', 'model'), actorOf(req), req.body));
  });
  router.post(`${base}/releases/:releaseId/restore`, releasers, async (req, res) => {
    res.status(201).json(await restoreRelease(ctx, ws(req), idParam(req, 'releaseId', 'release'), actorOf(req), req.body));
  });
  router.get(`${base}/audit`, admins, async (req, res) => {
    res.json(await listAuditEvents(ctx.db, ws(req), parseAuditQuery(req.query)));
  });
  router.get(`${base}/audit.csv`, admins, async (req, res) => {
    const q = parseAuditQuery(req.query);
    const events = await listAuditEvents(ctx.db, ws(req), { ...q, limit: q.limit ?? 100_000 });
    res.set({ 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': contentDisposition('lariat-audit-log.csv') });
    res.send(auditCsv(events));
  });
  return router;
}
