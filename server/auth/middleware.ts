/**
 * Authentication and authorization middleware for every area's routes.
 *
 *   router.get('/workspaces/:workspaceId/datasets', requireWorkspaceRole('admin', 'analyst', 'reviewer', 'viewer'), handler)
 *   router.post('/workspaces/:workspaceId/datasets', requireWorkspaceRole('admin', 'analyst'), handler)
 *   router.get('/something-personal', requireSession, handler)
 *
 * - `requireSession`: verifies the session cookie (HS256 JWT) and its server-side row (not revoked,
 *   not expired, not past its absolute lifetime); sets `req.user = { id, email, name }`; otherwise 401.
 * - `requireWorkspaceRole(...roles)`: runs requireSession if needed, then checks the caller's
 *   membership of `:workspaceId` (from req.params, or from the URL when a sub-router lacks
 *   mergeParams); sets `req.membership = { workspaceId, role }`. A workspace you don't belong to (or
 *   a malformed id) is a 404, so existence never leaks; a role outside `roles` is a 403. Roles are not
 *   a strict ladder (reviewers review, analysts upload), so each route lists the roles it accepts;
 *   `anyMember` is the list of all four.
 * - CSRF (see csrf.ts, mounted once for all of /api by `authBase`): every non-GET/HEAD/OPTIONS request
 *   must send the session's CSRF token (also in the readable CSRF cookie) in the `X-Lariat-CSRF` header, and a present Origin header
 *   must match the server. Exempt from the header (Origin check still applies): sign-in, sign-up,
 *   password-reset request and complete, and invitation accept; see csrf.ts for why.
 * These read the AppContext that `authBase(ctx)` stores in res.locals, so they need no arguments.
 */
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { Router } from 'express';
import { WORKSPACE_ROLES, type WorkspaceRole } from '../../shared/members';
import { findMembership } from '../accounts/memberships';
import type { AppContext } from '../context';
import { forbidden, HttpError, notFound, unauthorized } from '../http/errors';
import { clearAuthCookies, readCookie, sessionCookieName } from './cookies';
import { csrfProtection } from './csrf';
import { findLiveSession, renewIfHalfSpent, type SessionUser } from './sessions';
import { verifySessionToken } from './session-token';

export interface RequestMembership {
  workspaceId: string;
  role: WorkspaceRole;
}

declare module 'express-serve-static-core' {
  interface Request {
    /** Set by requireSession. */
    user?: SessionUser;
    /** The session's jti, set by requireSession (sign-out revokes it). */
    sessionId?: string;
    /** Set by requireWorkspaceRole. */
    membership?: RequestMembership;
  }
}

export type { SessionUser };

/** Stores the context for the middleware below and applies CSRF protection to all of /api. */
export function authBase(ctx: AppContext): Router {
  const router = Router();
  router.use((_req, res, next) => {
    res.locals.lariat = ctx;
    next();
  });
  router.use(csrfProtection(ctx));
  return router;
}

export function contextOf(res: Response): AppContext {
  const ctx = res.locals.lariat as AppContext | undefined;
  if (!ctx) throw new Error('authBase(ctx) must be mounted before the auth middleware');
  return ctx;
}

/** The signed-in user when the request carries a valid session, else null (sets req.user). */
export async function loadSession(req: Request, res: Response): Promise<SessionUser | null> {
  if (req.user) return req.user;
  const ctx = contextOf(res);
  const token = readCookie(req, sessionCookieName(ctx.config));
  if (!token) return null;
  const verified = await verifySessionToken(ctx.config.sessionSecret, token);
  if (!verified.ok) {
    clearAuthCookies(res, ctx.config);
    throw unauthorized(verified.reason === 'expired' ? 'Your session has expired. Sign in again.' : 'Your session is not valid. Sign in again.');
  }
  const { userId, sessionId, expiresAt } = verified.claims;
  const live = await findLiveSession(ctx, sessionId, userId);
  if (!live) {
    clearAuthCookies(res, ctx.config);
    throw unauthorized('Your session has ended (signed out or expired). Sign in again.');
  }
  await renewIfHalfSpent(ctx, res, { userId, sessionId, expiresAt, createdAt: live.createdAt });
  const user = live.user;
  req.user = user;
  req.sessionId = sessionId;
  return user;
}

export const requireSession: RequestHandler = async (req, res, next) => {
  const user = await loadSession(req, res);
  if (!user) throw unauthorized('Sign in first.');
  next();
};

/** req.user after requireSession, typed as present. */
export function sessionUser(req: Request): SessionUser {
  if (!req.user) throw unauthorized('Sign in first.');
  return req.user;
}

/** req.membership after requireWorkspaceRole, typed as present. */
export function workspaceMembership(req: Request): RequestMembership {
  if (!req.membership) throw new HttpError(500, 'requireWorkspaceRole must run before this handler');
  return req.membership;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function workspaceIdOf(req: Request): string | undefined {
  const fromParams = (req.params as Record<string, string | undefined>).workspaceId;
  if (fromParams) return fromParams;
  return /\/api\/workspaces\/([^/?#]+)/.exec(req.originalUrl)?.[1];
}

export function requireWorkspaceRole(...roles: WorkspaceRole[]): RequestHandler {
  if (roles.length === 0) throw new Error('requireWorkspaceRole needs at least one role (use anyMember for all)');
  return async (req: Request, res: Response, next: NextFunction) => {
    const user = await loadSession(req, res);
    if (!user) throw unauthorized('Sign in first.');
    const workspaceId = workspaceIdOf(req);
    const hidden = notFound('No such workspace, or you are not a member of it.');
    if (!workspaceId || !UUID.test(workspaceId)) throw hidden;
    const membership = await findMembership(contextOf(res).db, workspaceId, user.id);
    if (!membership) throw hidden;
    if (!roles.includes(membership.role)) {
      throw forbidden(`This needs the role ${roles.join(' or ')} in this workspace; yours is ${membership.role}.`);
    }
    req.membership = { workspaceId, role: membership.role };
    next();
  };
}

/** Every member, whatever the role. */
export const anyMember = requireWorkspaceRole(...WORKSPACE_ROLES);
