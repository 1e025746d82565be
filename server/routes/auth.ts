/** /api/auth: sign-up, sign-in, sign-out, me, password reset. Thin: validate, call a service, shape the answer. */
import { Router, type Response } from 'express';
import {
  CSRF_COOKIE,
  passwordResetCompleteSchema,
  passwordResetRequestSchema,
  signInSchema,
  signUpSchema,
  type MeDto,
  type UserDto,
} from '../../shared/auth';
import { authenticate, membershipSummaries, signUp } from '../accounts/accounts';
import { completePasswordReset, requestPasswordReset } from '../accounts/password-resets';
import { toUserDto } from '../accounts/users';
import { clearAuthCookies, setCsrfCookie } from '../auth/cookies';
import { loadSession, requireSession, sessionUser } from '../auth/middleware';
import { createRateLimits } from '../auth/rate-limits';
import { revokeSession, startSession } from '../auth/sessions';
import type { AppContext } from '../context';
import { parseBody } from './parse-body';

export function authRouter(ctx: AppContext): Router {
  const router = Router();
  const limits = createRateLimits(ctx.config);

  async function me(user: UserDto, csrfToken: string): Promise<MeDto> {
    return { user: toUserDto(user), memberships: await membershipSummaries(ctx.db, user.id), csrfToken };
  }

  router.post('/auth/sign-up', limits.signUp, async (req, res) => {
    const input = parseBody(signUpSchema, req.body);
    const { user } = await signUp(ctx.db, input);
    const csrf = await startSession(ctx, res, user.id);
    res.status(201).json(await me(user, csrf));
  });

  router.post('/auth/sign-in', ...limits.signIn, async (req, res) => {
    const input = parseBody(signInSchema, req.body);
    const user = await authenticate(ctx.db, input.email, input.password);
    const csrf = await startSession(ctx, res, user.id);
    res.json(await me(user, csrf));
  });

  router.post('/auth/sign-out', async (req, res: Response) => {
    // Signing out with a session that is already gone still clears the cookies and succeeds.
    const user = await loadSession(req, res).catch(() => null);
    if (user && req.sessionId) await revokeSession(ctx.db, req.sessionId);
    clearAuthCookies(res, ctx.config);
    res.status(204).end();
  });

  router.get('/auth/me', requireSession, async (req, res) => {
    const existing: unknown = req.cookies?.[CSRF_COOKIE];
    const csrf = typeof existing === 'string' && existing !== '' ? existing : setCsrfCookie(res, ctx.config);
    res.json(await me(sessionUser(req), csrf));
  });

  router.post('/auth/password-reset/request', ...limits.resetRequest, async (req, res) => {
    const { email } = parseBody(passwordResetRequestSchema, req.body);
    await requestPasswordReset(ctx, email);
    res.status(202).json({ message: 'If an account uses this e-mail address, a reset link is on its way. It works for 1 hour.' });
  });

  router.post('/auth/password-reset/complete', limits.resetComplete, async (req, res) => {
    const { token, password } = parseBody(passwordResetCompleteSchema, req.body);
    await completePasswordReset(ctx.db, token, password);
    res.json({ message: 'Your password is changed, and every session of your account was signed out. Sign in with the new password.' });
  });

  return router;
}
