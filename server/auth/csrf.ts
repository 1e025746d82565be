/**
 * CSRF defence for every state-changing /api request (OWASP CSRF Prevention Cheat Sheet: "signed
 * double-submit cookie" and "verifying origin with standard headers"):
 * 1. Origin check: when the browser sends Origin, it must be the public URL's origin or the origin
 *    the request was addressed to (the Vite dev proxy keeps the Host of the page).
 * 2. A token tied to the session: with a session cookie, the `X-Lariat-CSRF` header must equal
 *    HMAC(session secret, session id), which the server hands out at sign-in and in /auth/me (and
 *    puts in the readable CSRF cookie). Another site can make the browser send cookies but can read
 *    neither the cookie nor the answer; and unlike a plain double-submit cookie, a value planted in
 *    the cookie jar (by a sibling subdomain, say) is worthless: it must match this very session.
 *    Without a session (the request will be refused by the route anyway) the header must equal
 *    the CSRF cookie, as before.
 * Exempt from (2), not from (1): sign-in, sign-up and password-reset request (no session exists to
 * abuse yet; they are rate limited), and the endpoints that carry an e-mailed secret token
 * (sign-up complete, password-reset complete, invitation accept): an attacker cannot forge a request without that token.
 * Not cookie-authenticated at all: the consumer API under /api/v1 (server/consumers/api/routes.ts) is
 * mounted before this middleware and reads only an `Authorization: Bearer` API key, never a cookie.
 * CSRF works by making a browser send its cookies; a browser never adds an Authorization header on its
 * own, so a forged cross-site request carries no key. The /v1 pattern below only documents that: a
 * session cookie sent to /api/v1 is ignored there.
 */
import { createHmac } from 'node:crypto';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { CSRF_HEADER } from '../../shared/auth';
import type { AppContext } from '../context';
import { HttpError } from '../http/errors';
import { csrfCookieName, readCookie, sessionCookieName } from './cookies';
import { verifySessionToken } from './session-token';
import { sameSecret } from './tokens';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
const EXEMPT = [
  /^\/auth\/sign-in\/?$/,
  /^\/auth\/sign-up(\/complete)?\/?$/,
  /^\/auth\/password-reset\/(request|complete)\/?$/,
  /^\/invitations\/[^/]+\/accept\/?$/,
  /^\/v1\//,
];

/** The CSRF token of one session: derived, so it needs no storage and dies with the session. */
export function csrfTokenFor(secret: string, sessionId: string): string {
  return createHmac('sha256', secret).update(`lariat-csrf|${sessionId}`).digest('base64url');
}

export function csrfProtection(ctx: AppContext): RequestHandler {
  const publicOrigin = new URL(ctx.config.publicUrl).origin;
  const cookieName = csrfCookieName(ctx.config);
  const refused = () =>
    new HttpError(
      403,
      `This request is missing its CSRF token, or carries another session's: send the ${cookieName} cookie's value in the ${CSRF_HEADER} header (reload the page if it persists).`,
      CSRF_HEADER,
    );
  return async (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const origin = req.get('origin');
    if (origin !== undefined && origin !== publicOrigin && origin !== `${req.protocol}://${req.get('host')}`) {
      return next(new HttpError(403, `Requests from ${origin} are not accepted; use Lariat at ${publicOrigin}.`));
    }
    if (EXEMPT.some((pattern) => pattern.test(req.path))) return next();
    const header = req.get(CSRF_HEADER);
    if (!header) return next(refused());
    const sessionToken = readCookie(req, sessionCookieName(ctx.config));
    const verified = sessionToken ? await verifySessionToken(ctx.config.sessionSecret, sessionToken) : undefined;
    const expected = verified?.ok ? csrfTokenFor(ctx.config.sessionSecret, verified.claims.sessionId) : readCookie(req, cookieName);
    if (!expected || !sameSecret(expected, header)) return next(refused());
    next();
  };
}
