/**
 * Unexpected errors: the client gets a generic message with an id; the server log gets one line with
 * the same id, the error's class, its SQLSTATE code, constraint, table and column, and the stack
 * frames, never the error's own message or detail for database errors (drizzle puts the query and
 * its parameters there, PostgreSQL's detail quotes the offending values: e-mails, password hashes,
 * session ids, cells of an upload). OWASP Logging Cheat Sheet: "data to exclude".
 *
 * Reusable by any feature that stores or shows an error it did not make itself:
 *
 *   const { message } = reportUnexpected(error, 'ingest');   // store/show `message`, never error.message
 *   const text = publicMessage(error, 'ingest', (e) => e instanceof FileProblem);
 */
import { randomBytes } from 'node:crypto';

export interface ReportedError {
  /** Short random id printed in the log line and given to the person. */
  id: string;
  /** What the person sees: generic, with the id to quote. */
  message: string;
}

interface Described {
  name?: unknown;
  message?: unknown;
  code?: unknown;
  constraint?: unknown;
  table?: unknown;
  column?: unknown;
  stack?: unknown;
  cause?: unknown;
}

const SAFE_TOKEN = /^[A-Za-z0-9_.$-]{1,80}$/;
const safe = (v: unknown) => (typeof v === 'string' && SAFE_TOKEN.test(v) ? v : undefined);

/** PostgreSQL errors (and drizzle's wrapper around them) carry an SQLSTATE code somewhere in the chain. */
function databaseError(err: Described): Described | undefined {
  for (let e: Described | undefined = err, depth = 0; e && depth < 5; e = e.cause as Described | undefined, depth++) {
    if (typeof e.code === 'string' && /^[0-9A-Z]{5}$/.test(e.code)) return e;
  }
  return undefined;
}

/** One log line's worth about an error, without anything a person typed or uploaded. */
export function describeForLog(err: unknown): string {
  const e = (err ?? {}) as Described;
  const parts = [`${safe(e.name) ?? typeof err}`];
  const db = databaseError(e);
  // drizzle also wraps failures that carry no SQLSTATE (a dropped connection, a pool timeout) in a
  // plain Error whose message starts with the query text: that counts as a query error too.
  const isQuery = db !== undefined || safe(e.name) === 'DrizzleQueryError' || (typeof e.message === 'string' && e.message.startsWith('Failed query:'));
  if (db) {
    for (const key of ['code', 'constraint', 'table', 'column'] as const) {
      const value = safe(db[key]);
      if (value) parts.push(`${key}=${value}`);
    }
  } else if (!isQuery && typeof e.message === 'string') {
    // A programming error (TypeError...): its first line, cut short; no quotes of data beyond that.
    parts.push(`message=${JSON.stringify(e.message.split('\n')[0].slice(0, 160))}`);
  }
  const frames = typeof e.stack === 'string' ? e.stack.split('\n').filter((l) => /^\s+at /.test(l)).slice(0, 8).map((l) => l.trim()) : [];
  return frames.length > 0 ? `${parts.join(' ')}\n    ${frames.join('\n    ')}` : parts.join(' ');
}

/** Logs the error under a new id and returns the id and the message for the person. */
export function reportUnexpected(err: unknown, where: string): ReportedError {
  const id = randomBytes(6).toString('hex');
  console.error(`[lariat] error ${id} in ${where}: ${describeForLog(err)}`);
  return { id, message: `Something went wrong on the server (error ${id}). The error was logged; quote this id when you report it.` };
}

/** Lariat's own errors keep their message; anything else is reported and replaced by the generic one. */
export function publicMessage(err: unknown, where: string, isOwn: (e: unknown) => e is Error): string {
  return isOwn(err) ? err.message : reportUnexpected(err, where).message;
}
