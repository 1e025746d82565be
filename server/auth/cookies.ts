/**
 * The two cookies: the session cookie (httpOnly, the signed session token) and the CSRF cookie
 * (readable by the client, echoed in the X-Lariat-CSRF header). Both SameSite=Lax, path /, no
 * Domain. When the public URL is https they are Secure and carry the `__Host-` prefix, which tells
 * the browser to refuse any version of them set by a sibling subdomain or over http (RFC 6265bis
 * 4.1.3.2), so nobody can plant a session or a CSRF value from elsewhere.
 */
import type { CookieOptions, Request, Response } from 'express';
import { CSRF_COOKIE } from '../../shared/auth';
import type { Config } from '../config';
import { randomToken } from './tokens';

const SESSION_COOKIE = 'lariat_session';

const secure = (config: Config) => config.publicUrl.startsWith('https:');

export function sessionCookieName(config: Config): string {
  return secure(config) ? `__Host-${SESSION_COOKIE}` : SESSION_COOKIE;
}

export function csrfCookieName(config: Config): string {
  return secure(config) ? `__Host-${CSRF_COOKIE}` : CSRF_COOKIE;
}

function base(config: Config): CookieOptions {
  return { sameSite: 'lax', secure: secure(config), path: '/' };
}

export function readCookie(req: Request, name: string): string | undefined {
  const value: unknown = req.cookies?.[name];
  return typeof value === 'string' && value !== '' ? value : undefined;
}

export function setSessionCookie(res: Response, config: Config, token: string, expiresAt: Date): void {
  res.cookie(sessionCookieName(config), token, { ...base(config), httpOnly: true, expires: expiresAt });
}

/**
 * Sets the CSRF cookie (a session cookie in the browser's sense: it lasts until the browser closes)
 * to `value`, the session's own token (csrf.ts csrfTokenFor), or a random one when signed out.
 */
export function setCsrfCookie(res: Response, config: Config, value: string = randomToken()): string {
  res.cookie(csrfCookieName(config), value, { ...base(config), httpOnly: false });
  return value;
}

export function clearAuthCookies(res: Response, config: Config): void {
  res.clearCookie(sessionCookieName(config), { ...base(config), httpOnly: true });
  res.clearCookie(csrfCookieName(config), base(config));
}
