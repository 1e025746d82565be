/**
 * Consumer API rate limits (in memory per server process, like the session API's; every count times
 * LARIAT_RATE_LIMIT_FACTOR): 600 requests a minute per key, so one runaway consumer cannot starve
 * the others (a scoring request may carry 50,000 rows); and 60 refused keys per 15 minutes per IP
 * address, which costs a prober nothing it could have won (a key has 256 random bits) but keeps the
 * key lookup from being hammered.
 */
import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Config } from '../../config';

function limiter(windowMs: number, limit: number, key: (req: Request) => string, message: string, onlyFailures = false): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    skipSuccessfulRequests: onlyFailures,
    // "Failure" here is a refused key (401), not a 429 of the per-key budget nor a 4xx about the rows.
    requestWasSuccessful: (_req, res) => res.statusCode !== 401,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: key,
    handler: (req, res) => {
      const reset = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime;
      res.set('Retry-After', String(reset ? Math.max(1, Math.ceil((reset.getTime() - Date.now()) / 1000)) : Math.ceil(windowMs / 1000)));
      res.status(429).json({ error: { message, field: 'Authorization' } });
    },
  });
}

const scaled = (config: Config, n: number) => Math.max(1, Math.round(n * config.LARIAT_RATE_LIMIT_FACTOR));

/** Counts only refused keys (401 answers), per address. */
export function refusedKeyLimit(config: Config): RequestHandler {
  return limiter(15 * 60_000, scaled(config, 60), (req) => ipKeyGenerator(req.ip ?? 'unknown'), 'Too many requests with a wrong API key from this address; wait a while.', true);
}

/** After requireApiKey: per key. */
export function perKeyLimit(config: Config): RequestHandler {
  return limiter(60_000, scaled(config, 600), (req) => req.apiKey?.id ?? 'none', 'This API key has made too many requests this minute; wait a moment (see Retry-After).');
}
