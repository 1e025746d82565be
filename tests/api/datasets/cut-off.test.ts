/**
 * Uploads cut off by the client, many times over: every stream of each one is destroyed, so no file
 * descriptor stays open on a (deleted) temporary file and nothing is left in the temporary folder.
 * Descriptors are read from /proc/self/fd (Linux): the app runs in this process.
 */
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import type http from 'node:http';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../support/app';
import { uniqueEmail } from '../../support/session';
import { listen, multipartHead, rawSignUp, startUpload, type RawSession } from './raw-http';
import { closeApp, tableCounts } from './support';

let t: TestApp;
let server: http.Server;
let port: number;
let s: RawSession;

beforeAll(async () => {
  t = await startTestApp();
  ({ server, port } = await listen(t.app));
  s = await rawSignUp(t.app, uniqueEmail('cut'));
});
afterAll(async () => {
  server?.close();
  await closeApp(t);
});

const tempDir = () => path.resolve(t.ctx.config.LARIAT_STATE_DIR, 'ingest');

/** Every open descriptor of this process, as the path it points to. */
function openDescriptors(): string[] {
  const out: string[] = [];
  for (const fd of fs.readdirSync('/proc/self/fd')) {
    try {
      out.push(fs.readlinkSync(`/proc/self/fd/${fd}`));
    } catch {
      // closed between the listing and the read
    }
  }
  return out;
}

async function progressOf(ingest: string): Promise<{ phase: string; bytesReceived: number } | null> {
  const res = await fetch(`http://127.0.0.1:${port}/api/workspaces/${s.workspaceId}/ingests/${ingest}`, { headers: { Cookie: s.cookie } });
  return res.status === 200 ? ((await res.json()) as { phase: string; bytesReceived: number }) : null;
}

async function waitFor(what: string, test: () => Promise<boolean>): Promise<void> {
  for (let i = 0; i < 200; i++) {
    if (await test()) return;
    await new Promise((r) => setTimeout(r, 20));
  }
  throw new Error(`timed out waiting for ${what}`);
}

/** Sends part of a file, waits until the server has written some of it, then drops the connection. */
async function cutOffUpload(): Promise<void> {
  const ingest = randomUUID();
  const req = startUpload(port, s, ingest);
  req.on('error', () => undefined); // the destroyed socket
  req.write(multipartHead('cut.csv') + 'a,b\n' + '1,2\n'.repeat(20_000));
  await waitFor('the server to receive bytes', async () => ((await progressOf(ingest))?.bytesReceived ?? 0) > 0);
  req.destroy();
  await waitFor('the ingest to be marked failed', async () => (await progressOf(ingest))?.phase === 'failed');
}

describe('cut-off uploads', () => {
  it('leave no open descriptor and no file behind, however many there are', async () => {
    const N = 12;
    const before = await tableCounts(t);
    const fdsBefore = openDescriptors();
    for (let i = 0; i < N; i++) await cutOffUpload();
    // Closing is asynchronous: give the destroyed streams a moment to release their descriptors.
    await new Promise((r) => setTimeout(r, 200));
    const fdsAfter = openDescriptors();
    const dir = tempDir();
    expect(fdsAfter.filter((p) => p.startsWith(dir))).toEqual([]);
    // Descriptors elsewhere (database connections, sockets) may come and go, but not one per upload.
    expect(fdsAfter.length - fdsBefore.length).toBeLessThan(N);
    expect(fs.existsSync(dir) ? fs.readdirSync(dir) : []).toEqual([]);
    expect(await tableCounts(t)).toEqual(before);
  });
});
