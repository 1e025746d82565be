/**
 * What an ingest failure may say to the people who see it (the uploader's answer, and the progress
 * entry every member can poll). Lariat's own errors were written for them and pass on; anything else
 * (a database error whose text carries the query and its parameters, a bug) becomes a generic
 * message with an id, and the server log gets the same id with the error's name, code and
 * constraint but never its message, which may quote the values of the failed query.
 *
 * TODO(security branch): once server/http/ offers the shared "generic message + id" helper, call it
 * from `unexpected()` below instead of logging here; the callers stay as they are.
 */
import { randomUUID } from 'node:crypto';
import { HttpError } from '../../http/errors';
import { FileProblem } from '../parse/errors';
import { ConversionProblem } from '../storage/convert';

/** PostgreSQL's fields that name what failed without quoting any value. */
interface DatabaseFields {
  code?: string;
  constraint?: string;
  table?: string;
  column?: string;
}

function databaseFields(error: unknown): DatabaseFields | null {
  // drizzle wraps the driver's error (DrizzleQueryError: query and params in the message) as `cause`.
  for (let e = error as (Error & DatabaseFields & { cause?: unknown }) | undefined, depth = 0; e && depth < 3; e = e.cause as typeof e, depth++) {
    if (typeof e.code === 'string' && /^[0-9A-Z]{5}$/.test(e.code)) return { code: e.code, constraint: e.constraint, table: e.table, column: e.column };
  }
  return null;
}

/** The error's stack without its first line (which repeats the message). */
function frames(error: unknown): string {
  const stack = error instanceof Error && typeof error.stack === 'string' ? error.stack : '';
  return stack.split('\n').filter((line) => /^\s+at /.test(line)).slice(0, 8).join('\n');
}

/** Logs an unexpected error safely and returns the id the user is told. */
export function logUnexpected(where: string, error: unknown): string {
  const id = randomUUID().slice(0, 8);
  const name = error instanceof Error ? error.name : typeof error;
  const db = databaseFields(error);
  const facts = db
    ? Object.entries(db)
        .filter(([, v]) => v !== undefined)
        .map(([k, v]) => `${k}=${String(v)}`)
        .join(' ')
    : // Not from the database: our own code's message names no stored value.
      `message=${JSON.stringify(error instanceof Error ? error.message.slice(0, 300) : String(error).slice(0, 300))}`;
  console.error(`[lariat] ${where} failed (error id ${id}): ${name} ${facts}\n${frames(error)}`);
  return id;
}

export interface PublicFailure {
  status: number;
  message: string;
  field?: string;
}

/** A problem Lariat described itself keeps its words; anything else is logged and replaced. */
export function publicIngestFailure(error: unknown): PublicFailure {
  if (error instanceof FileProblem || error instanceof HttpError) return { status: error.status, message: error.message, field: error.field };
  if (error instanceof ConversionProblem) return { status: 400, message: error.message, field: 'file' };
  const db = databaseFields(error);
  if (db?.code === '23505' && (db.constraint === 'dataset_uploads_checksum_unique' || db.constraint === 'dataset_versions_number_unique')) {
    // ingest.ts locks against these races; should one slip through, it is still a conflict, not a fault.
    return { status: 409, message: 'Another upload to this dataset was stored at the same moment; nothing was stored from this one. Reload the dataset and try again if needed.', field: 'file' };
  }
  const id = logUnexpected('ingest', error);
  return { status: 500, message: `The upload failed on the server and nothing was stored. Please try again; if it fails again, tell your administrator the error id ${id}.` };
}
