/**
 * GET /api/dev/outbox: the e-mails the local fake SMTP server captured, newest first, for admins of
 * any workspace. Mounted only when NODE_ENV is development or test; in production the route does not
 * exist (404 like any unknown API path).
 */
import { Router } from 'express';
import { isAdminAnywhere } from '../accounts/memberships';
import { requireSession, sessionUser } from '../auth/middleware';
import type { AppContext } from '../context';
import { forbidden } from '../http/errors';

export interface OutboxMessageDto {
  id: number;
  to: string[];
  subject: string;
  text: string;
  receivedAt: string;
}

export function devOutboxRouter(ctx: AppContext): Router {
  const router = Router();
  if (ctx.config.NODE_ENV === 'production') return router;
  router.get('/dev/outbox', requireSession, async (req, res) => {
    if (!(await isAdminAnywhere(ctx.db, sessionUser(req).id))) throw forbidden('The outbox is for workspace admins.');
    const messages: OutboxMessageDto[] = (ctx.devMailbox?.messages ?? [])
      .slice()
      .reverse()
      .map((m) => ({ id: m.id, to: m.to, subject: m.subject, text: m.text, receivedAt: m.receivedAt }));
    res.json({ messages });
  });
  return router;
}
