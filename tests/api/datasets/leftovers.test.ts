/**
 * Start-up sweep: received files and column spill files left by a process that died mid-ingest are
 * removed when the server starts; other files in the state folder are not touched.
 */
import { spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { sweepIngestLeftovers } from '../../../server/datasets/service/leftovers';
import { startTestApp, type TestApp } from '../../support/app';
import { closeApp } from './support';

let t: TestApp | undefined;
afterAll(async () => closeApp(t));

describe('leftover ingest files', () => {
  it('are removed when the app starts', async () => {
    const stateDir = `.lariat/test-state/leftovers-${randomBytes(4).toString('hex')}`;
    const ingestDir = path.resolve(stateDir, 'ingest');
    fs.mkdirSync(ingestDir, { recursive: true });
    for (const name of ['1b2c.upload', '9f8e.columns', 'notes.txt']) fs.writeFileSync(path.join(ingestDir, name), 'x'.repeat(1000));
    t = await startTestApp({ LARIAT_STATE_DIR: stateDir });
    expect(fs.readdirSync(ingestDir)).toEqual(['notes.txt']);
  });

  it("sweep an import folder whose process has ended, never a running process's", () => {
    const temp = fs.mkdtempSync(path.join(os.tmpdir(), 'lariat-sweep-test-'));
    try {
      const ended = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' });
      const deadPid = Number(ended.stdout);
      for (const pid of [deadPid, process.pid, process.ppid]) {
        fs.mkdirSync(path.join(temp, `lariat-ingest-${pid}`));
        fs.writeFileSync(path.join(temp, `lariat-ingest-${pid}`, 'x.columns'), 'x');
      }
      fs.mkdirSync(path.join(temp, 'lariat-ingest-notapid'));
      const uploads = path.join(temp, 'uploads-that-do-not-exist');
      expect(sweepIngestLeftovers(uploads, temp)).toBe(1);
      expect(fs.readdirSync(temp).sort()).toEqual([`lariat-ingest-${process.pid}`, `lariat-ingest-${process.ppid}`, 'lariat-ingest-notapid'].sort());
    } finally {
      fs.rmSync(temp, { recursive: true, force: true });
    }
  });
});
