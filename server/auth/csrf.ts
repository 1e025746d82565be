/**
 * CSRF defence for every state-changing /api request (OWASP CSRF Prevention Cheat Sheet: "signed
 * double-submit cookie" and "verifying origin with standard headers"):
 * 1. Origin check: when the browser sends Origin, it must be the public URL's origin or the origin
 *    the request was addressed to (the Vite dev proxy keeps the Host of the page).
 * 2. Double submit: the `X-Lariat-CSRF` header must equal the `lariat_csrf` cookie. Another site can
 *    make the browser send the cookie but cannot read it to put it in a header.
 * Exempt from (2), not from (1): sign-in, sign-up and password-reset request (no session exists to
 * abuse yet; they are rate limited), and the two endpoints that carry an e-mailed secret token
 * (password-reset complete, invitation accept): an attacker cannot forge a request without that token.
 */
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { CSRF_COOKIE, CSRF_HEADER } from '../../shared/auth';
import type { AppContext } from '../context';
import { HttpError } from '../http/errors';
import { sameSecret } from './tokens';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
const EXEMPT = [
  /^\/auth\/sign-in\/?$/,
  /^\/auth\/sign-up\/?$/,
  /^\/auth\/password-reset\/(request|complete)\/?$/,
  /^\/invitations\/[^/]+\/accept\/?$/,
];

export function csrfProtection(ctx: AppContext): RequestHandler {
  const publicOrigin = new URL(ctx.config.publicUrl).origin;
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const origin = req.get('origin');
    if (origin !== undefined && origin !== publicOrigin && origin !== `${req.protocol}://${req.get('host')}`) {
      return next(new HttpError(403, `Requests from ${origin} are not accepted; use Lariat at ${publicOrigin}.`));
    }
    if (EXEMPT.some((pattern) => pattern.test(req.path))) return next();
    const cookie: unknown = req.cookies?.[CSRF_COOKIE];
    const header = req.get(CSRF_HEADER);
    if (typeof cookie !== 'string' || cookie === '' || !header || !sameSecret(cookie, header)) {
      return next(
        new HttpError(403, `This request is missing its CSRF token: send the ${CSRF_COOKIE} cookie's value in the ${CSRF_HEADER} header (reload the page if it persists).`, CSRF_HEADER),
      );
    }
    next();
  };
}
