/**
 * Streams a multipart upload to a temporary file with busboy, hashing as it goes (SHA-256). The size
 * limit is enforced while streaming: busboy's `limits.fileSize` truncates and emits 'limit', and we
 * stop reading and answer 413 at once, without buffering the rest. A request cut off mid-way
 * rejects with ClientGone. In every failure each stream is destroyed (busboy, its file stream and the
 * write stream, so no descriptor stays open) and the temporary file is removed once it is closed.
 */
import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import busboy from 'busboy';
import type { Request } from 'express';
import { FileProblem } from '../parse/errors';

export interface ReceivedUpload {
  fields: Record<string, string>;
  filePath: string;
  fileName: string;
  sha256: string;
  sizeBytes: number;
}

export class ClientGone extends Error {
  constructor() {
    super('The upload was cut off before it finished; nothing was stored.');
    this.name = 'ClientGone';
  }
}

/**
 * The name the uploader's system gave the file, as shown and offered back on download: its last
 * path segment (either separator: browsers on Windows may send C:\\...), control characters
 * (newlines, NUL) replaced, at most 200 characters.
 */
export function safeFileName(raw: string | undefined): string {
  const last = (raw ?? '').split(/[/\\]/).pop() ?? '';
  // eslint-disable-next-line no-control-regex -- control characters are what this removes
  const clean = last.replace(/[\u0000-\u001f\u007f]/g, '_').trim().slice(0, 200);
  return clean === '' || clean === '.' || clean === '..' ? 'upload.csv' : clean;
}

function formatMb(bytes: number): string {
  return `${Number((bytes / (1024 * 1024)).toPrecision(3))} MB`;
}

export function receiveUpload(req: Request, opts: { limitBytes: number; tempDir: string; onBytes?: (bytes: number) => void }): Promise<ReceivedUpload> {
  return new Promise((resolve, reject) => {
    let bb: busboy.Busboy;
    try {
      bb = busboy({ headers: req.headers, limits: { fileSize: opts.limitBytes, files: 1, fields: 20, fieldSize: 10_000 } });
    } catch {
      reject(new FileProblem('Send the file as multipart/form-data with the file in a part named "file".'));
      return;
    }
    fs.mkdirSync(opts.tempDir, { recursive: true });
    const filePath = path.join(opts.tempDir, `${randomUUID()}.upload`);
    const fields: Record<string, string> = {};
    const hash = createHash('sha256');
    let fileName = '';
    let sizeBytes = 0;
    let written: Promise<void> | null = null;
    let fileStream: NodeJS.ReadableStream & { destroy(): void } | null = null;
    let out: fs.WriteStream | null = null;
    let done = false;

    const fail = (error: Error) => {
      if (done) return;
      done = true;
      req.unpipe(bb);
      fileStream?.destroy();
      bb.destroy();
      // Remove the file only once its descriptor is closed: an unlinked file that is still open
      // keeps its disk space until the process ends.
      const remove = () => fs.rm(filePath, { force: true }, () => undefined);
      if (out && !out.closed) {
        out.once('close', remove);
        out.destroy();
      } else remove();
      reject(error);
    };

    bb.on('field', (name, value) => {
      fields[name] = value;
    });
    bb.on('file', (name, stream, info) => {
      if (name !== 'file' || written) {
        stream.resume();
        return;
      }
      fileName = safeFileName(info.filename);
      fileStream = stream;
      const file = (out = fs.createWriteStream(filePath));
      stream.on('data', (chunk: Buffer) => {
        hash.update(chunk);
        sizeBytes += chunk.length;
        opts.onBytes?.(sizeBytes);
      });
      stream.on('limit', () => {
        // busboy emits 'limit' in the middle of its own write and touches the file stream afterwards:
        // destroy the streams once that write has returned.
        process.nextTick(() =>
          fail(new FileProblem(`${fileName} is larger than the upload limit of ${formatMb(opts.limitBytes)}; the upload was stopped at that point and nothing was stored.`, 413)),
        );
      });
      written = new Promise((ok, ko) => {
        file.on('finish', ok);
        file.on('error', ko);
      });
      written.catch(() => undefined); // a write error after a failure is expected; fail() already answered
      stream.pipe(file);
    });
    bb.on('error', () => fail(new FileProblem('The upload is not well-formed multipart/form-data.')));
    bb.on('close', () => {
      if (done) return;
      if (!written) return fail(new FileProblem('No file in the upload: send the CSV in a multipart part named "file".'));
      written.then(
        () => {
          if (done) return;
          done = true;
          resolve({ fields, filePath, fileName, sha256: hash.digest('hex'), sizeBytes });
        },
        (error: Error) => fail(error),
      );
    });
    req.on('close', () => {
      if (!req.complete) fail(new ClientGone());
    });
    req.pipe(bb);
  });
}
