/**
 * Uploads stopped mid-way: over the size limit (refused while streaming, long before the client has
 * sent everything) and cut off by the client (nothing stored, no temporary file left).
 */
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import type http from 'node:http';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../support/app';
import { uniqueEmail } from '../../support/session';
import { BOUNDARY, listen, multipartHead, rawSignUp, startUpload, type RawSession } from './raw-http';
import { closeApp, tableCounts } from './support';

let t: TestApp;
let server: http.Server;
let port: number;
let s: RawSession;
const LIMIT_BYTES = Math.floor(0.01 * 1024 * 1024); // LARIAT_UPLOAD_LIMIT_MB = 0.01

beforeAll(async () => {
  t = await startTestApp({ LARIAT_UPLOAD_LIMIT_MB: '0.01', LARIAT_COLUMN_LIMIT: '3' });
  ({ server, port } = await listen(t.app));
  s = await rawSignUp(t.app, uniqueEmail('raw'));
});
afterAll(async () => {
  server?.close();
  await closeApp(t);
});

const ROW = '1.5,2.5,3.5,4.5\n';
const tempDir = () => path.resolve(t.ctx.config.LARIAT_STATE_DIR, 'ingest');
const leftovers = () => (fs.existsSync(tempDir()) ? fs.readdirSync(tempDir()) : []);

describe('upload limits', () => {
  it('refuses a file over the limit while it streams: 413 after ~limit bytes, not the whole body', async () => {
    const before = await tableCounts(t);
    const ingest = randomUUID();
    const req = startUpload(port, s, ingest);
    const response = new Promise<{ status: number; body: string }>((resolve, reject) => {
      req.on('response', (res) => {
        let body = '';
        res.on('data', (c: Buffer) => (body += c.toString()));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
      });
      req.on('error', reject);
    });
    let answered = false;
    void response.then(() => (answered = true), () => (answered = true));
    req.write(multipartHead('big.csv') + 'a,b,c,d\n');
    // The planned file is 64 MB, far more than the socket buffers hold. Keep sending (respecting
    // back-pressure) until the server answers; a server that read the whole body before answering
    // would let all of it through.
    const PLANNED = 64 * 1024 * 1024;
    const chunk = ROW.repeat(256);
    let sent = 0;
    while (!answered && sent + chunk.length <= PLANNED) {
      sent += chunk.length;
      if (!req.write(chunk)) await Promise.race([new Promise((r) => req.once('drain', r)), response.catch(() => undefined)]);
    }
    const finishedSending = !answered;
    if (finishedSending) req.end(`\r\n--${BOUNDARY}--\r\n`);
    const res = await response;
    req.destroy();
    expect(res.status).toBe(413);
    const message = (JSON.parse(res.body) as { error: { message: string } }).error.message;
    expect(message).toMatch(/big\.csv is larger than the upload limit of 0\.01 MB/);
    // The answer came while the client still had most of the planned file to send, and the server
    // took exactly the limit's worth of file bytes (busboy truncates there).
    expect(finishedSending).toBe(false);
    expect(sent).toBeLessThan(PLANNED / 2);
    expect(sent).toBeGreaterThan(LIMIT_BYTES);
    const progress = await fetch(`http://127.0.0.1:${port}/api/workspaces/${s.workspaceId}/ingests/${ingest}`, { headers: { Cookie: s.cookie } });
    expect(await progress.json()).toMatchObject({ phase: 'failed', bytesReceived: LIMIT_BYTES });
    expect(await tableCounts(t)).toEqual(before);
    await new Promise((r) => setTimeout(r, 100));
    expect(leftovers()).toEqual([]);
  });

  it('stores nothing when the client cuts the upload off mid-way', async () => {
    const before = await tableCounts(t);
    const ingest = randomUUID();
    const req = startUpload(port, s, ingest);
    req.on('error', () => undefined); // the destroyed socket
    req.write(multipartHead('cut.csv') + 'a,b\n' + '1,2\n'.repeat(500));
    await new Promise((r) => setTimeout(r, 150));
    req.destroy();
    // The server notices the closed connection and marks the ingest failed.
    let phase = '';
    for (let i = 0; i < 40 && phase !== 'failed'; i++) {
      await new Promise((r) => setTimeout(r, 50));
      const res = await fetch(`http://127.0.0.1:${port}/api/workspaces/${s.workspaceId}/ingests/${ingest}`, { headers: { Cookie: s.cookie } });
      phase = ((await res.json()) as { phase: string }).phase;
    }
    expect(phase).toBe('failed');
    expect(await tableCounts(t)).toEqual(before);
    expect(leftovers()).toEqual([]);
  });

  it('refuses more columns than LARIAT_COLUMN_LIMIT, naming the file and both counts', async () => {
    const before = await tableCounts(t);
    const res = await request(t.app)
      .post(`/api/workspaces/${s.workspaceId}/datasets/uploads`)
      .set('Cookie', s.cookie)
      .set('X-Lariat-CSRF', s.csrf)
      .attach('file', Buffer.from('a,b,c,d\n1,2,3,4\n'), 'wide.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('wide.csv has 4 columns; the limit is 3.');
    expect(await tableCounts(t)).toEqual(before);
  });
});
