/** /api/workspaces: my workspaces, creating one, members and invitations (roles checked by middleware). */
import { Router } from 'express';
import { changeRoleSchema, createInvitationSchema } from '../../shared/members';
import { createWorkspaceSchema } from '../../shared/workspaces';
import { invite, listPendingInvitations, revokeInvitation } from '../accounts/invitations';
import { changeRole, listMembers, removeMember } from '../accounts/memberships';
import { createWorkspace } from '../accounts/accounts';
import { findWorkspaceOf, listWorkspacesOf } from '../accounts/workspaces';
import { anyMember, requireSession, requireWorkspaceRole, sessionUser, workspaceMembership } from '../auth/middleware';
import { createRateLimits } from '../auth/rate-limits';
import type { AppContext } from '../context';
import { notFound } from '../http/errors';
import { parseBody } from './parse-body';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A path id that is not a UUID cannot exist: 404 instead of a database type error. */
function idParam(value: string | string[] | undefined, what: string): string {
  if (typeof value !== 'string' || !UUID.test(value)) throw notFound(`No such ${what} in this workspace.`);
  return value;
}

export function workspacesRouter(ctx: AppContext): Router {
  const router = Router();
  const admin = requireWorkspaceRole('admin');
  const limits = createRateLimits(ctx.config);

  router.get('/workspaces', requireSession, async (req, res) => {
    res.json({ workspaces: await listWorkspacesOf(ctx.db, sessionUser(req).id) });
  });

  router.post('/workspaces', requireSession, limits.createWorkspace, async (req, res) => {
    const { name } = parseBody(createWorkspaceSchema, req.body);
    res.status(201).json(await createWorkspace(ctx.db, name, sessionUser(req).id));
  });

  router.get('/workspaces/:workspaceId', anyMember, async (req, res) => {
    const ws = await findWorkspaceOf(ctx.db, sessionUser(req).id, workspaceMembership(req).workspaceId);
    if (!ws) throw notFound('No such workspace, or you are not a member of it.');
    res.json(ws);
  });

  router.get('/workspaces/:workspaceId/members', anyMember, async (req, res) => {
    res.json({ members: await listMembers(ctx.db, workspaceMembership(req).workspaceId) });
  });

  router.patch('/workspaces/:workspaceId/members/:userId', admin, async (req, res) => {
    const { role } = parseBody(changeRoleSchema, req.body);
    const { workspaceId } = workspaceMembership(req);
    await changeRole(ctx.db, workspaceId, idParam(req.params.userId, 'member'), role);
    res.json({ members: await listMembers(ctx.db, workspaceId) });
  });

  router.delete('/workspaces/:workspaceId/members/:userId', admin, async (req, res) => {
    await removeMember(ctx.db, workspaceMembership(req).workspaceId, idParam(req.params.userId, 'member'));
    res.status(204).end();
  });

  router.get('/workspaces/:workspaceId/invitations', admin, async (req, res) => {
    res.json({ invitations: await listPendingInvitations(ctx.db, workspaceMembership(req).workspaceId) });
  });

  router.post('/workspaces/:workspaceId/invitations', admin, limits.invite, async (req, res) => {
    const input = parseBody(createInvitationSchema, req.body);
    res.status(201).json(await invite(ctx, workspaceMembership(req).workspaceId, sessionUser(req), input));
  });

  router.delete('/workspaces/:workspaceId/invitations/:invitationId', admin, async (req, res) => {
    await revokeInvitation(ctx.db, workspaceMembership(req).workspaceId, idParam(req.params.invitationId, 'invitation'));
    res.status(204).end();
  });

  return router;
}
