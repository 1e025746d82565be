/**
 * What an ingest failure may say to the people who see it (the uploader's answer, and the progress
 * entry every member can poll). Lariat's own errors were written for them and pass on; anything else
 * (a database error whose text carries the query and its parameters, a bug) goes through
 * reportUnexpected (server/http/unexpected.ts): a generic message with an id, and one log line with
 * the same id, the error's class, code and constraint, never its message.
 */
import { HttpError } from '../../http/errors';
import { reportUnexpected } from '../../http/unexpected';
import { FileProblem } from '../parse/errors';
import { ConversionProblem } from '../storage/convert';

export interface PublicFailure {
  status: number;
  message: string;
  field?: string;
}

/** The unique constraints two ingests into one dataset can collide on. */
const RACE_CONSTRAINTS = new Set(['dataset_uploads_checksum_unique', 'dataset_versions_number_unique']);

function uniqueViolation(error: unknown): string | null {
  for (let e = error as { code?: unknown; constraint?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 5; e = e.cause as typeof e, depth++) {
    if (e.code === '23505' && typeof e.constraint === 'string') return e.constraint;
  }
  return null;
}

/** A problem Lariat described itself keeps its words; anything else is logged and replaced. */
export function publicIngestFailure(error: unknown): PublicFailure {
  if (error instanceof FileProblem || error instanceof HttpError) return { status: error.status, message: error.message, field: error.field };
  if (error instanceof ConversionProblem) return { status: 400, message: error.message, field: 'file' };
  const constraint = uniqueViolation(error);
  if (constraint && RACE_CONSTRAINTS.has(constraint)) {
    // ingest.ts locks against these races; should one slip through, it is still a conflict, not a fault.
    return { status: 409, message: 'Another upload to this dataset was stored at the same moment; nothing was stored from this one. Reload the dataset and try again if needed.', field: 'file' };
  }
  return { status: 500, message: `The upload failed and nothing was stored. ${reportUnexpected(error, 'ingest').message}` };
}
