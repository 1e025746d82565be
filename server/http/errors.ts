import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import { reportUnexpected } from './unexpected';

/** An error meant for the client: an HTTP status, a message that names the field, and the field. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly field?: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const badRequest = (message: string, field?: string, details?: unknown) =>
  new HttpError(400, message, field, details);
export const unauthorized = (message = 'Sign in first.') => new HttpError(401, message);
export const forbidden = (message = 'Your role in this workspace does not allow this.') => new HttpError(403, message);
export const notFound = (message = 'Not found.') => new HttpError(404, message);
export const conflict = (message: string, field?: string) => new HttpError(409, message, field);

/** Turns a zod failure into a 400 naming the first offending field. */
export function fromZod(error: ZodError, where = 'body'): HttpError {
  const issue = error.issues[0];
  const path = issue.path.join('.');
  const field = path || where;
  const message =
    issue.code === 'unrecognized_keys'
      ? `Unknown field${issue.keys.length > 1 ? 's' : ''} in ${where}: ${issue.keys.join(', ')}`
      : `${field}: ${issue.message}`;
  return new HttpError(400, message, field, error.issues);
}

/** Retry-After on a 503 when no database connection came free: a few seconds clears a burst. */
const BUSY_RETRY_SECONDS = 5;
/** pg-pool's message when connectionTimeoutMillis passes without a free connection (pg-pool index.js). */
const POOL_TIMEOUT = 'timeout exceeded when trying to connect';

/** True when the error, or what it wraps (drizzle wraps the driver's errors), is pg-pool's wait timeout. */
function waitedForConnection(err: unknown): boolean {
  for (let e = err as { message?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 5; e = e.cause as typeof e, depth++) {
    if (e.message === POOL_TIMEOUT) return true;
  }
  return false;
}

interface BodyParserError extends Error {
  type?: string;
  status?: number;
  expose?: boolean;
  limit?: number;
}

/**
 * The last middleware: every error becomes `{ error: { message, field? } }` with a 4xx or 500. Only
 * Lariat's own errors (HttpError, zod failures) and the body parser's client errors pass their
 * message on; anything else is a 500 with a generic message and an id that matches the log line
 * (server/http/unexpected.ts), never a stack trace, SQL or the values in it.
 */
export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, next) => {
  if (res.headersSent) return next(err);
  if (err instanceof ZodError) err = fromZod(err);
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: { message: err.message, field: err.field } });
    return;
  }
  const e = err as BodyParserError;
  if (e?.type === 'entity.parse.failed') {
    res.status(400).json({ error: { message: 'The request body is not valid JSON.', field: 'body' } });
    return;
  }
  if (e?.type === 'entity.too.large') {
    res.status(413).json({ error: { message: `The request body is larger than the limit (${e.limit} bytes).`, field: 'body' } });
    return;
  }
  if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500 && e.expose === true && typeof e.type === 'string') {
    res.status(e.status).json({ error: { message: e.message } });
    return;
  }
  const where = `${req.method} ${req.baseUrl}${req.route ? String((req.route as { path: unknown }).path) : ''}`;
  if (waitedForConnection(err)) {
    // Not a fault in the request or in Lariat's code: every database connection was busy for the
    // whole connection timeout (LARIAT_DB_CONNECT_TIMEOUT_MS). Tell the client to come back.
    console.error(`[lariat] busy: no database connection came free in time for ${where}`);
    res.setHeader('Retry-After', String(BUSY_RETRY_SECONDS));
    res.status(503).json({ error: { message: `The server is busy. Try again in ${BUSY_RETRY_SECONDS} seconds.` } });
    return;
  }
  const reported = reportUnexpected(err, where);
  res.status(500).json({ error: { message: reported.message, id: reported.id } });
};
