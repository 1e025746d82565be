/**
 * The server-side progress of an upload, read through the API while the upload runs: a file large
 * enough for the parse worker (about 10 MB) is polled every few milliseconds. Phases only move forward
 * (receiving, parsing, storing, done), the fraction never falls within a phase, rows parsed never
 * fall, and the last answer is done at 100% with every row counted. Expected counts are the ones
 * the test writes; the browser test covers the transfer bar.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { IngestProgressDto } from '../../../shared/datasets';
import { WORKER_MIN_BYTES } from '../../../server/datasets/service/parse-thread';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, withCsrf, type Session } from '../../support/session';
import { apiBase, closeApp, uploadUrl } from './support';

let t: TestApp;
let alice: Session;

beforeAll(async () => {
  t = await startTestApp();
  alice = await signUp(t.app);
});
afterAll(async () => closeApp(t));

const ORDER = ['receiving', 'parsing', 'storing', 'done'];

describe('ingest progress', () => {
  it('moves forward through the phases and ends at 100% with every row', async () => {
    const rows = 220_000;
    const lines = Array.from({ length: rows }, (_, i) => `${i % 97},${(i * 0.731).toFixed(4)},${(i * 1.37).toFixed(4)},${i % 3 ? 'a' : 'b'},${(i % 1000) / 7}`);
    const content = Buffer.from(`g,x,y,label,z\n${lines.join('\n')}\n`);
    expect(content.length).toBeGreaterThan(WORKER_MIN_BYTES);
    const ingest = randomUUID();
    const seen: IngestProgressDto[] = [];
    let finished = false;
    const polling = (async () => {
      while (!finished) {
        const res = await alice.agent.get(`${apiBase(alice)}/ingests/${ingest}`);
        if (res.status === 200) seen.push(res.body as IngestProgressDto);
        await new Promise((r) => setTimeout(r, 5));
      }
    })();
    const res = await withCsrf(alice.agent.post(uploadUrl(alice, ingest)), alice.csrf).attach('file', content, 'progress-big.csv');
    finished = true;
    await polling;
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    seen.push((await alice.agent.get(`${apiBase(alice)}/ingests/${ingest}`)).body as IngestProgressDto);

    const problems: string[] = [];
    for (let i = 1; i < seen.length; i++) {
      const [a, b] = [seen[i - 1], seen[i]];
      const [pa, pb] = [ORDER.indexOf(a.phase), ORDER.indexOf(b.phase)];
      if (pb < 0 || pb < pa) problems.push(`phase ${a.phase} -> ${b.phase}`);
      if (pa === pb && b.fraction < a.fraction) problems.push(`${b.phase}: fraction ${a.fraction} -> ${b.fraction}`);
      if (b.rowsParsed < a.rowsParsed) problems.push(`rows ${a.rowsParsed} -> ${b.rowsParsed}`);
      if (b.bytesReceived < a.bytesReceived) problems.push(`bytes ${a.bytesReceived} -> ${b.bytesReceived}`);
    }
    expect(problems, `samples: ${seen.length}`).toEqual([]);
    expect(seen.some((s) => s.phase === 'parsing' || s.phase === 'storing'), `phases seen: ${[...new Set(seen.map((s) => s.phase))]}`).toBe(true);
    expect(seen.every((s) => s.fraction >= 0 && s.fraction <= 1)).toBe(true);
    expect(seen.at(-1)).toMatchObject({ phase: 'done', fraction: 1, rowsParsed: rows, bytesReceived: content.length });
  });
});
