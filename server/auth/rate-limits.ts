/**
 * Rate limits (express-rate-limit, in memory per app; docs/decisions/0007-rate-limits.md). Every
 * count is multiplied by LARIAT_RATE_LIMIT_FACTOR (1 in production; the test suites raise it).
 *
 * Sign-in, failed attempts only:
 * - per IP and e-mail: 10 per 15 minutes (one person's typos, or one attacker on one account);
 * - per IP: 50 per 15 minutes (one address spraying many accounts);
 * - per e-mail from all addresses: no lock-out, a progressive delay (accountDelay below), so an
 *   attacker can slow guessing on an account but cannot lock its owner out.
 * Others: reset requests 5 per IP and e-mail and 30 per IP; reset completion 20 per IP; sign-ups
 * 20 per IP per hour; invitations 50 and new workspaces 20 per account per hour; wrong current
 * passwords when changing the password 10 per account per 15 minutes.
 * req.ip honours X-Forwarded-For only for the proxies named by LARIAT_TRUST_PROXY (server/app.ts).
 */
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Config } from '../config';

const MINUTE = 60_000;

function emailOf(req: Request): string {
  const email: unknown = (req.body as Record<string, unknown> | undefined)?.email;
  return typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : '';
}

const ip = (req: Request) => ipKeyGenerator(req.ip ?? 'unknown');
const account = (req: Request) => req.user?.id ?? ip(req);

interface LimitSpec {
  limit: number;
  windowMinutes: number;
  key: (req: Request) => string;
  message: string;
  field?: string;
  onlyFailures?: boolean;
}

function limiter(factor: number, spec: LimitSpec): RequestHandler {
  return rateLimit({
    windowMs: spec.windowMinutes * MINUTE,
    limit: Math.max(1, Math.round(spec.limit * factor)),
    skipSuccessfulRequests: spec.onlyFailures ?? false,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: spec.key,
    handler: (req, res) => {
      const reset = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime;
      const seconds = reset ? Math.max(1, Math.ceil((reset.getTime() - Date.now()) / 1000)) : spec.windowMinutes * 60;
      res.set('Retry-After', String(seconds));
      res.status(429).json({ error: { message: spec.message, field: spec.field } });
    },
  });
}

/**
 * Slows sign-in for an e-mail that has had many failed attempts from anywhere: after `free`
 * failures in 15 minutes each attempt waits 100 ms, doubling, at most 5 s. A right password still
 * gets in (after the wait), so nobody can lock a chosen person out; a guesser gets ~12 tries a
 * minute per connection. Unknown e-mails are counted the same way, so the delay reveals nothing.
 */
export function accountDelay(factor: number, opts: { free?: number; baseMs?: number; maxMs?: number; maxKeys?: number } = {}): RequestHandler {
  const free = Math.round((opts.free ?? 10) * factor);
  const baseMs = opts.baseMs ?? 100;
  const maxMs = opts.maxMs ?? 5000;
  const maxKeys = opts.maxKeys ?? 50_000;
  const failures = new Map<string, { count: number; since: number }>();
  return async (req: Request, res: Response, next: NextFunction) => {
    const key = emailOf(req);
    const now = Date.now();
    let entry = failures.get(key);
    if (entry && now - entry.since > 15 * MINUTE) {
      failures.delete(key);
      entry = undefined;
    }
    const over = (entry?.count ?? 0) - free;
    if (over >= 0) await new Promise((r) => setTimeout(r, Math.min(maxMs, baseMs * 2 ** Math.min(over, 20))));
    res.on('finish', () => {
      if (res.statusCode === 401) {
        const current = failures.get(key);
        if (current) current.count += 1;
        else {
          // Oldest first out: a flood of made-up e-mails cannot grow the map without bound.
          if (failures.size >= maxKeys) failures.delete(failures.keys().next().value as string);
          failures.set(key, { count: 1, since: Date.now() });
        }
      } else if (res.statusCode < 400) failures.delete(key);
    });
    next();
  };
}

export interface RateLimits {
  signIn: RequestHandler[];
  signUp: RequestHandler;
  resetRequest: RequestHandler[];
  resetComplete: RequestHandler;
  invite: RequestHandler;
  createWorkspace: RequestHandler;
  changePassword: RequestHandler;
}

export function createRateLimits(config: Pick<Config, 'LARIAT_RATE_LIMIT_FACTOR'>): RateLimits {
  const f = config.LARIAT_RATE_LIMIT_FACTOR;
  const wait = 'Wait 15 minutes and try again.';
  return {
    signIn: [
      limiter(f, { limit: 50, windowMinutes: 15, key: ip, onlyFailures: true, field: 'email', message: `Too many failed sign-in attempts from your network. ${wait}` }),
      limiter(f, {
        limit: 10,
        windowMinutes: 15,
        key: (req) => `${ip(req)}|${emailOf(req)}`,
        onlyFailures: true,
        field: 'email',
        message: 'Too many sign-in attempts for this e-mail address. Wait 15 minutes, or reset your password.',
      }),
      accountDelay(f),
    ],
    signUp: limiter(f, { limit: 20, windowMinutes: 60, key: ip, field: 'email', message: 'Too many sign-ups from your network. Wait an hour and try again.' }),
    resetRequest: [
      limiter(f, { limit: 30, windowMinutes: 15, key: ip, field: 'email', message: `Too many password-reset requests from your network. ${wait}` }),
      limiter(f, {
        limit: 5,
        windowMinutes: 15,
        key: (req) => `${ip(req)}|${emailOf(req)}`,
        field: 'email',
        message: 'Too many password-reset requests for this e-mail address. Wait 15 minutes and check your inbox.',
      }),
    ],
    resetComplete: limiter(f, { limit: 20, windowMinutes: 15, key: ip, field: 'token', message: `Too many attempts to use reset links. ${wait}` }),
    invite: limiter(f, { limit: 50, windowMinutes: 60, key: account, field: 'email', message: 'You have sent many invitations in the last hour. Wait a while and try again.' }),
    createWorkspace: limiter(f, { limit: 20, windowMinutes: 60, key: account, field: 'name', message: 'You have created many workspaces in the last hour. Wait a while and try again.' }),
    // A stolen session must not become a password-guessing oracle.
    changePassword: limiter(f, { limit: 10, windowMinutes: 15, key: account, onlyFailures: true, field: 'currentPassword', message: `Too many wrong current passwords. ${wait}` }),
  };
}
