/** /api/invitations/:token: what an e-mailed invitation is for, and accepting it. */
import { Router } from 'express';
import { acceptInvitationSchema, tokenSchema } from '../../shared/auth';
import { acceptInvitation, previewInvitation } from '../accounts/invitations';
import { loadSession } from '../auth/middleware';
import { startSession } from '../auth/sessions';
import type { AppContext } from '../context';
import { fromZod } from '../http/errors';
import { parseBody } from './parse-body';

function tokenParam(value: unknown): string {
  const parsed = tokenSchema.safeParse(value);
  if (!parsed.success) throw fromZod(parsed.error, 'token');
  return parsed.data;
}

export function invitationsRouter(ctx: AppContext): Router {
  const router = Router();

  router.get('/invitations/:token', async (req, res) => {
    res.json(await previewInvitation(ctx.db, tokenParam(req.params.token)));
  });

  router.post('/invitations/:token/accept', async (req, res) => {
    const token = tokenParam(req.params.token);
    const body = parseBody(acceptInvitationSchema, req.body);
    // A stale session cookie must not block a new person from accepting: treat it as signed out.
    const signedIn = await loadSession(req, res).catch(() => null);
    const result = await acceptInvitation(ctx.db, token, signedIn, body);
    // A brand-new account is signed in straight away; an existing one already is.
    const csrfToken = result.created ? await startSession(ctx, res, result.user.id, req.get('user-agent')) : undefined;
    res.status(201).json({ user: result.user, workspaceId: result.workspaceId, role: result.role, ...(csrfToken ? { csrfToken } : {}) });
  });

  return router;
}
