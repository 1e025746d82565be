/**
 * Sends a generated body with stream.pipeline, so a client that goes away mid-download ends the
 * generator (its `finally` runs, no further chunk is read from the database) instead of leaving the
 * handler waiting for a 'drain' that never comes. `openDownloads()` counts the bodies still being
 * sent, which tests use to see that none is left hanging.
 */
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import { reportUnexpected } from '../../http/unexpected';

let open = 0;

export function openDownloads(): number {
  return open;
}

export async function sendStream(res: Response, body: AsyncIterable<string | Buffer>): Promise<void> {
  open++;
  try {
    await pipeline(Readable.from(body), res);
  } catch (error) {
    // The client closing the connection is not a fault; anything else is logged (the status line is
    // already sent, so the connection is cut short, which the client sees as a failed download).
    if ((error as NodeJS.ErrnoException).code !== 'ERR_STREAM_PREMATURE_CLOSE') reportUnexpected(error, 'download');
  } finally {
    open--;
  }
}
