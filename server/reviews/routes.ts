/**
 * Reviews, comparisons and notices under /api/workspaces/:workspaceId, plus the personal e-mail
 * switches under /api/me. Roles: admins and analysts ask for and withdraw reviews; admins, analysts and
 * reviewers comment; admins and reviewers decide (never on their own fit; the service checks that);
 * viewers read. CSRF is checked for every state-changing request by authBase.
 */
import type { Request } from 'express';
import { Router } from 'express';
import { anyMember, requireSession, requireWorkspaceRole, sessionUser, workspaceMembership } from '../auth/middleware';
import type { AppContext } from '../context';
import { getComparison } from '../compare/service';
import { notFound } from '../http/errors';
import { getMailPreferences, listNotices, markNoticesRead, setMailPreferences } from '../notices/read';
import { addComment, decideReview, getReview, listReviews, requestReview, withdrawReview, type Actor } from './service';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function idParam(req: Request, name: string, what: string): string {
  const id = req.params[name];
  if (typeof id !== 'string' || !UUID.test(id)) throw notFound(`No such ${what} in this workspace.`);
  return id;
}

export function actorOf(req: Request): Actor {
  return { user: sessionUser(req), role: workspaceMembership(req).role, ip: req.ip ?? null };
}

export function reviewsRouter(ctx: AppContext): Router {
  const router = Router();
  const base = '/workspaces/:workspaceId';
  const ws = (req: Request) => workspaceMembership(req).workspaceId;
  const askers = requireWorkspaceRole('admin', 'analyst');
  const commenters = requireWorkspaceRole('admin', 'analyst', 'reviewer');
  const deciders = requireWorkspaceRole('admin', 'reviewer');

  router.get(`${base}/reviews`, anyMember, async (req, res) => {
    res.json(await listReviews(ctx, ws(req), req.query));
  });
  router.post(`${base}/fits/:fitId/reviews`, askers, async (req, res) => {
    res.status(201).json(await requestReview(ctx, ws(req), idParam(req, 'fitId', 'fit'), actorOf(req), req.body));
  });
  router.get(`${base}/reviews/:reviewId`, anyMember, async (req, res) => {
    res.json(await getReview(ctx, ws(req), idParam(req, 'reviewId', 'review'), actorOf(req)));
  });
  router.post(`${base}/reviews/:reviewId/comments`, commenters, async (req, res) => {
    res.status(201).json(await addComment(ctx, ws(req), idParam(req, 'reviewId', 'review'), actorOf(req), req.body));
  });
  router.post(`${base}/reviews/:reviewId/decision`, deciders, async (req, res) => {
    res.json(await decideReview(ctx, ws(req), idParam(req, 'reviewId', 'review'), actorOf(req), req.body));
  });
  router.post(`${base}/reviews/:reviewId/withdraw`, askers, async (req, res) => {
    res.json(await withdrawReview(ctx, ws(req), idParam(req, 'reviewId', 'review'), actorOf(req)));
  });
  router.get(`${base}/comparisons`, anyMember, async (req, res) => {
    res.json(await getComparison(ctx, ws(req), req.query));
  });
  router.get(`${base}/notices`, anyMember, async (req, res) => {
    res.json(await listNotices(ctx.db, ws(req), sessionUser(req).id));
  });
  router.post(`${base}/notices/read`, anyMember, async (req, res) => {
    res.json(await markNoticesRead(ctx.db, ws(req), sessionUser(req).id, req.body));
  });
  router.get('/me/mail-preferences', requireSession, async (req, res) => {
    res.json(await getMailPreferences(ctx.db, sessionUser(req).id));
  });
  router.put('/me/mail-preferences', requireSession, async (req, res) => {
    res.json(await setMailPreferences(ctx.db, sessionUser(req).id, req.body));
  });
  return router;
}
