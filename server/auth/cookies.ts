/**
 * The two cookies: `lariat_session` (httpOnly, the signed session token) and `lariat_csrf`
 * (readable by the client, echoed in the X-Lariat-CSRF header). Both SameSite=Lax, and Secure when
 * the public URL is https.
 */
import type { CookieOptions, Response } from 'express';
import { CSRF_COOKIE } from '../../shared/auth';
import type { Config } from '../config';
import { randomToken } from './tokens';

export const SESSION_COOKIE = 'lariat_session';

function base(config: Config): CookieOptions {
  return { sameSite: 'lax', secure: config.publicUrl.startsWith('https:'), path: '/' };
}

export function setSessionCookie(res: Response, config: Config, token: string, expiresAt: Date): void {
  res.cookie(SESSION_COOKIE, token, { ...base(config), httpOnly: true, expires: expiresAt });
}

/** Sets a fresh CSRF cookie (a session cookie in the browser's sense: it lasts until the browser closes). */
export function setCsrfCookie(res: Response, config: Config): string {
  const value = randomToken();
  res.cookie(CSRF_COOKIE, value, { ...base(config), httpOnly: false });
  return value;
}

export function clearAuthCookies(res: Response, config: Config): void {
  res.clearCookie(SESSION_COOKIE, { ...base(config), httpOnly: true });
  res.clearCookie(CSRF_COOKIE, base(config));
}
