/**
 * Rate limits for the unauthenticated endpoints (express-rate-limit, in-memory per process; one store
 * per app so test apps don't share counters). Sign-in counts per IP and e-mail, so one person's typos
 * don't lock everybody behind a shared office address out.
 */
import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';

const FIFTEEN_MINUTES = 15 * 60_000;

function emailOf(req: Request): string {
  const email: unknown = (req.body as Record<string, unknown> | undefined)?.email;
  return typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : '';
}

function limiter(limit: number, key: (req: Request) => string, message: string, onlyFailures = false): RequestHandler {
  return rateLimit({
    windowMs: FIFTEEN_MINUTES,
    limit,
    skipSuccessfulRequests: onlyFailures,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: key,
    handler: (_req, res) => {
      res.status(429).json({ error: { message, field: 'email' } });
    },
  });
}

const ip = (req: Request) => ipKeyGenerator(req.ip ?? 'unknown');

export interface AuthRateLimits {
  signIn: RequestHandler;
  signUp: RequestHandler;
  resetRequest: RequestHandler;
}

export function createAuthRateLimits(): AuthRateLimits {
  return {
    // Only failed attempts count: signing in often (browser tests, several tabs) is not suspicious.
    signIn: limiter(10, (req) => `${ip(req)}|${emailOf(req)}`, 'Too many sign-in attempts for this e-mail address. Wait 15 minutes, or reset your password.', true),
    // Generous: API test files sign up many accounts from one address.
    signUp: limiter(100, ip, 'Too many sign-ups from this address. Wait 15 minutes and try again.'),
    resetRequest: limiter(5, (req) => `${ip(req)}|${emailOf(req)}`, 'Too many password-reset requests for this e-mail address. Wait 15 minutes and check your inbox.'),
  };
}
