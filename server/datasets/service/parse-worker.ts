/**
 * Worker-thread side of the ingest (parse-thread.ts): parses the file, then encodes and summarises
 * one column per request, handing its bytes over without a copy.
 */
import { parentPort } from 'node:worker_threads';
import type { FromWorker, ToWorker } from './parse-protocol';
import { ParseSession } from './parse-session';

let session: ParseSession | null = null;

function post(message: FromWorker, transfer: ArrayBuffer[] = []): void {
  parentPort!.postMessage(message, transfer);
}

function postError(error: unknown): void {
  const e = error as Error & { status?: number; field?: string };
  post({ type: 'error', error: { name: e.name, message: e.message, status: e.status, field: e.field } });
}

/** The bytes as an ArrayBuffer of their own (a small Buffer may share Node's pool, which must not move). */
function ownBuffer(data: Buffer): ArrayBuffer {
  if (data.byteOffset === 0 && data.byteLength === data.buffer.byteLength && data.buffer instanceof ArrayBuffer) return data.buffer;
  const copy = new ArrayBuffer(data.byteLength);
  new Uint8Array(copy).set(data);
  return copy;
}

async function parse(job: Extract<ToWorker, { type: 'parse' }>['job']): Promise<void> {
  session = await ParseSession.open(job, (bytes, rows) => post({ type: 'progress', bytes, rows }));
  post({ type: 'parsed', outcome: session.outcome });
}

function column(j: number): void {
  const { stored, schema } = session!.column(j); // the schema first: the bytes move below
  const data = ownBuffer(stored.data);
  post({ type: 'column', j, column: { name: stored.name, storage: stored.storage, data, levels: stored.levels, schema } }, [data]);
}

parentPort?.on('message', (message: ToWorker) => {
  try {
    if (message.type === 'parse') parse(message.job).catch(postError);
    else if (message.type === 'column') column(message.j);
    else {
      session?.close();
      parentPort!.close();
    }
  } catch (error) {
    postError(error);
  }
});
