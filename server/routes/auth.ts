/**
 * /api/auth: sign-up, sign-in, sign-out, me, password reset, and the signed-in person's sessions and
 * password. Thin: validate, call a service, shape the answer.
 */
import { Router, type Response } from 'express';
import {
  changePasswordSchema,
  completeSignUpSchema,
  passwordResetCompleteSchema,
  SIGN_UP_ACCEPTED,
  passwordResetRequestSchema,
  signInSchema,
  signUpSchema,
  type MeDto,
  type UserDto,
} from '../../shared/auth';
import { authenticate, membershipSummaries } from '../accounts/accounts';
import { completeSignUp, requestSignUp } from '../accounts/sign-up';
import { completePasswordReset, requestPasswordReset } from '../accounts/password-resets';
import { toUserDto } from '../accounts/users';
import { changePassword } from '../accounts/change-password';
import { clearAuthCookies, csrfCookieName, readCookie, setCsrfCookie } from '../auth/cookies';
import { csrfTokenFor } from '../auth/csrf';
import { loadSession, requireSession, sessionUser } from '../auth/middleware';
import { createRateLimits } from '../auth/rate-limits';
import { listLiveSessions, revokeOtherSessions, revokeSession, startSession } from '../auth/sessions';
import type { AppContext } from '../context';
import { outboxEnabled } from '../dev/outbox';
import { parseBody } from './parse-body';

export function authRouter(ctx: AppContext): Router {
  const router = Router();
  const limits = createRateLimits(ctx.config);

  async function me(user: UserDto, csrfToken: string): Promise<MeDto> {
    return { user: toUserDto(user), memberships: await membershipSummaries(ctx.db, user.id), csrfToken, devOutbox: outboxEnabled(ctx.config) };
  }

  // The same answer whether or not the address has an account; its owner is told by e-mail.
  router.post('/auth/sign-up', limits.signUp, async (req, res) => {
    const input = parseBody(signUpSchema, req.body);
    await requestSignUp(ctx, input);
    res.status(202).json({ message: SIGN_UP_ACCEPTED });
  });

  router.post('/auth/sign-up/complete', limits.signUpComplete, async (req, res) => {
    const { token } = parseBody(completeSignUpSchema, req.body);
    const { user } = await completeSignUp(ctx.db, token);
    const csrf = await startSession(ctx, res, user.id, req.get('user-agent'));
    res.status(201).json(await me(user, csrf));
  });

  router.post('/auth/sign-in', ...limits.signIn, async (req, res) => {
    const input = parseBody(signInSchema, req.body);
    const user = await authenticate(ctx.db, input.email, input.password);
    const csrf = await startSession(ctx, res, user.id, req.get('user-agent'));
    res.json(await me(user, csrf));
  });

  router.post('/auth/sign-out', async (req, res: Response) => {
    // Signing out with a session that is already gone still clears the cookies and succeeds.
    const user = await loadSession(req, res).catch(() => null);
    if (user && req.sessionId) await revokeSession(ctx.db, req.sessionId);
    clearAuthCookies(res, ctx.config);
    res.status(204).end();
  });

  /** The session's id, set by requireSession. */
  const sessionIdOf = (req: { sessionId?: string }) => req.sessionId as string;

  router.get('/auth/me', requireSession, async (req, res) => {
    // The session's own CSRF token; the cookie is (re)set if the browser lost it or holds another.
    const csrf = csrfTokenFor(ctx.config.sessionSecret, sessionIdOf(req));
    if (readCookie(req, csrfCookieName(ctx.config)) !== csrf) setCsrfCookie(res, ctx.config, csrf);
    res.json(await me(sessionUser(req), csrf));
  });

  router.get('/auth/sessions', requireSession, async (req, res) => {
    res.json({ sessions: await listLiveSessions(ctx, sessionUser(req).id, sessionIdOf(req)) });
  });

  router.post('/auth/sessions/sign-out-others', requireSession, async (req, res) => {
    const signedOut = await revokeOtherSessions(ctx.db, sessionUser(req).id, sessionIdOf(req));
    res.json({ signedOut });
  });

  router.post('/auth/password', requireSession, limits.changePassword, async (req, res) => {
    const input = parseBody(changePasswordSchema, req.body);
    const { signedOut } = await changePassword(ctx, sessionUser(req).id, sessionIdOf(req), input);
    res.json({ signedOut, message: `Your password is changed${signedOut > 0 ? `, and your ${signedOut} other session${signedOut === 1 ? ' was' : 's were'} signed out` : ''}. We sent you an e-mail about it.` });
  });

  router.post('/auth/password-reset/request', ...limits.resetRequest, async (req, res) => {
    const { email } = parseBody(passwordResetRequestSchema, req.body);
    requestPasswordReset(ctx, email);
    res.status(202).json({ message: 'If an account uses this e-mail address, a reset link is on its way. It works for 1 hour.' });
  });

  router.post('/auth/password-reset/complete', limits.resetComplete, async (req, res) => {
    const { token, password } = parseBody(passwordResetCompleteSchema, req.body);
    await completePasswordReset(ctx.db, token, password);
    res.json({ message: 'Your password is changed, and every session of your account was signed out. Sign in with the new password.' });
  });

  return router;
}
