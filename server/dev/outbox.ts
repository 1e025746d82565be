/**
 * GET /api/dev/outbox: the e-mails the local fake SMTP server captured, newest first. Off unless
 * LARIAT_DEV_OUTBOX=1, never in production (the server refuses to start with it there), and even
 * then each person sees only mail addressed to them, plus invitations sent from workspaces they
 * administer (docs/decisions/0006-development-outbox.md). Off, the route does not exist (404).
 */
import { Router } from 'express';
import { adminWorkspaceIds } from '../accounts/memberships';
import { requireSession, sessionUser } from '../auth/middleware';
import type { AppContext } from '../context';
import type { CapturedMessage } from '../mail/fake-smtp';

export interface OutboxMessageDto {
  id: number;
  to: string[];
  subject: string;
  text: string;
  receivedAt: string;
}

export function outboxEnabled(config: AppContext['config']): boolean {
  return config.NODE_ENV !== 'production' && config.LARIAT_DEV_OUTBOX === '1';
}

/** Mail to `email` itself, or an invitation about a workspace in `adminOf`. Never another person's reset link. */
export function visibleTo(message: CapturedMessage, email: string, adminOf: ReadonlySet<string>): boolean {
  if (message.to.includes(email.toLowerCase())) return true;
  return message.workspaceId !== null && adminOf.has(message.workspaceId);
}

export function devOutboxRouter(ctx: AppContext): Router {
  const router = Router();
  if (!outboxEnabled(ctx.config)) return router;
  router.get('/dev/outbox', requireSession, async (req, res) => {
    const user = sessionUser(req);
    const adminOf = await adminWorkspaceIds(ctx.db, user.id);
    const messages: OutboxMessageDto[] = (ctx.devMailbox?.messages ?? [])
      .filter((m) => visibleTo(m, user.email, adminOf))
      .reverse()
      .map((m) => ({ id: m.id, to: m.to, subject: m.subject, text: m.text, receivedAt: m.receivedAt }));
    res.json({ messages });
  });
  return router;
}
