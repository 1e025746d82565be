/** One multipart upload of a file through the real HTTP route, streamed from disk; shared by the ingest benches. */
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import type { BenchSession } from './session';

export interface UploadAnswer {
  status: number;
  body: string;
  /** From the first byte sent to the end of the answer. */
  seconds: number;
}

export function uploadFile(url: string, s: BenchSession, filePath: string): Promise<UploadAnswer> {
  const boundary = 'lariat-bench-boundary';
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${path.basename(filePath)}"\r\nContent-Type: text/csv\r\n\r\n`);
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const target = new URL(`${url}/api/workspaces/${s.workspaceId}/datasets/uploads`);
  const started = process.hrtime.bigint();
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: target.hostname,
        port: target.port,
        path: target.pathname,
        method: 'POST',
        headers: {
          'Content-Type': `multipart/form-data; boundary=${boundary}`,
          'Content-Length': String(head.length + fs.statSync(filePath).size + tail.length),
          Cookie: s.cookie,
          'X-Lariat-CSRF': s.csrf,
        },
      },
      (res) => {
        let body = '';
        res.on('data', (c: Buffer) => (body += c.toString()));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body, seconds: Number(process.hrtime.bigint() - started) / 1e9 }));
      },
    );
    req.on('error', reject);
    req.write(head);
    const file = fs.createReadStream(filePath, { highWaterMark: 1 << 20 });
    file.pipe(req, { end: false });
    file.on('end', () => req.end(tail));
  });
}
