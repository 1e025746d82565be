/**
 * Downloads: the cleaned CSV built a block of rows at a time gives the same table as one built whole
 * (checked against the expected text computed here from the generated input, across several blocks
 * and text windows); a client that goes away mid-download leaves no handler, stream or database
 * connection behind and the server goes on serving; odd file names come back in a safe
 * Content-Disposition that still carries the exact name (RFC 6266 / RFC 8187).
 */
import http from 'node:http';
import type pg from 'pg';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UploadResultDto } from '../../../shared/datasets';
import { openDownloads } from '../../../server/datasets/routes/send-stream';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, withCsrf, type Session } from '../../support/session';
import { apiBase, closeApp, upload, uploadUrl } from './support';
import { listen } from './raw-http';

let t: TestApp;
let alice: Session;
let server: http.Server;
let port: number;
let cookie: string;
let base: string;
const ROWS = 120_000; // 9 columns: blocks of 55,555 rows, so three blocks

/** A seeded table with numbers, missing values, categories, yes/no and free text needing quotes. */
function generate(): { csv: string; cleaned: string } {
  const words = ['alpha', 'beta, gamma', 'say "hi"', '=SUM(A1)', '-minus', 'plain', '@at', 'ünïcödé'];
  const input = ['id,amount,score,region,member,note,count,ratio,tag'];
  const output = ['id,amount,score,region,member,note,count,ratio,tag'];
  const q = (s: string) => (/[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
  const neutral = (s: string) => (/^[=+\-@\t\r]/.test(s) ? `'${s}` : s);
  for (let i = 1; i <= ROWS; i++) {
    const amount = i % 97 === 0 ? 'NA' : ((i * 37) % 1000 / 8 - 60).toFixed(3);
    const score = String((i * 13) % 101);
    const region = ['north', 'south', 'east', 'west'][i % 4];
    const member = i % 3 === 0 ? 'yes' : 'no';
    const note = `${words[i % words.length]} ${i}`;
    const count = String(i % 7);
    const ratio = (i / 7).toFixed(4);
    const tag = i % 11 === 0 ? '' : `t${i % 500}`;
    input.push([i, amount, score, region, member, q(note), count, ratio, tag].join(','));
    const num = (s: string) => (s === 'NA' || s === '' ? '' : String(Number(s)));
    output.push([String(i), num(amount), num(score), region, member, q(neutral(note)), num(count), num(ratio), tag].join(','));
  }
  return { csv: `${input.join('\n')}\n`, cleaned: `${output.join('\r\n')}\r\n` };
}

const table = generate();
let datasetId: string;

beforeAll(async () => {
  t = await startTestApp();
  alice = await signUp(t.app);
  ({ server, port } = await listen(t.app));
  const res = await upload(alice, table.csv, 'table.csv', { name: 'Big table' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  datasetId = (res.body as UploadResultDto).datasetId;
  cookie = alice.agent.jar.getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false }).toValueString();
  base = `${apiBase(alice)}/datasets/${datasetId}/versions/1`;
}, 60_000);
afterAll(async () => {
  server?.close();
  await closeApp(t);
});

const pool = () => (t.ctx.db as unknown as { $client: pg.Pool }).$client;

/** GETs a download on a real socket and drops the connection after the first bytes. */
function startAndDrop(path: string): Promise<number> {
  return new Promise((resolve, reject) => {
    const req = http.get({ host: '127.0.0.1', port, path, headers: { Cookie: cookie } }, (res) => {
      if (res.statusCode !== 200) return reject(new Error(`HTTP ${res.statusCode}`));
      res.once('data', (chunk: Buffer) => {
        res.pause();
        req.destroy();
        resolve(chunk.length);
      });
    });
    req.on('error', () => undefined);
  });
}

async function settled(what: string, test: () => boolean): Promise<void> {
  for (let i = 0; i < 250 && !test(); i++) await new Promise((r) => setTimeout(r, 20));
  expect(test(), what).toBe(true);
}

describe('downloads', () => {
  it('cleaned.csv, built a block at a time, is the whole table as expected', async () => {
    const res = await alice.agent.get(`${base}/cleaned.csv`).buffer(true);
    expect(res.status).toBe(200);
    const got = res.text.split('\r\n');
    const expected = table.cleaned.split('\r\n');
    expect(got.length).toBe(expected.length);
    const firstDiff = got.findIndex((line, i) => line !== expected[i]);
    expect(firstDiff, `line ${firstDiff}: got ${got[firstDiff]}, expected ${expected[firstDiff]}`).toBe(-1);
  });

  it('the original comes back byte for byte', async () => {
    const res = await alice.agent
      .get(`${base}/original`)
      .buffer(true)
      .parse((resp, cb) => {
        const parts: Buffer[] = [];
        resp.on('data', (c: Buffer) => parts.push(c));
        resp.on('end', () => cb(null, Buffer.concat(parts)));
      });
    expect(res.status).toBe(200);
    expect(Buffer.compare(res.body as Buffer, Buffer.from(table.csv, 'utf8'))).toBe(0);
  });

  for (const which of ['original', 'cleaned.csv']) {
    it(`a client that goes away mid-way through ${which} leaves nothing running, and the server goes on serving`, async () => {
      for (let i = 0; i < 3; i++) expect(await startAndDrop(`${base}/${which}`)).toBeGreaterThan(0);
      await settled('every download handler has ended', () => openDownloads() === 0);
      await settled('every database connection is back in the pool', () => pool().idleCount === pool().totalCount && pool().waitingCount === 0);
      const after = await alice.agent.get(base);
      expect(after.status).toBe(200);
      expect(after.body.rowCount).toBe(ROWS);
    });
  }
});

describe('odd file names in Content-Disposition', () => {
  const BOUNDARY = 'odd-name-boundary';
  /** A multipart body whose file part names the file with RFC 5987's filename* (busboy decodes it). */
  function body(encodedName: string, k: number): Buffer {
    return Buffer.from(
      `--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename*=utf-8''${encodedName}\r\nContent-Type: text/csv\r\n\r\n` +
        `a,b\r\n1,${k}\r\n2,3\r\n\r\n--${BOUNDARY}--\r\n`,
    );
  }

  const cases: [string, string, string, string][] = [
    // [what, as sent (percent-encoded), stored name, header expected]
    ['quotes and a backslash', 'say%20%22hi%22%20%5C%20it%27s.csv', 'it\'s.csv', `attachment; filename="it's.csv"; filename*=UTF-8''it%27s.csv`],
    ['double quotes', 'say%20%22hi%22.csv', 'say "hi".csv', `attachment; filename="say _hi_.csv"; filename*=UTF-8''say%20%22hi%22.csv`],
    ['a newline and a NUL', 'two%0Alines%00.csv', 'two_lines_.csv', `attachment; filename="two_lines_.csv"; filename*=UTF-8''two_lines_.csv`],
    ['unicode', 'donn%C3%A9es%20%E2%82%AC%20%F0%9F%93%8A.csv', 'données € 📊.csv', `attachment; filename="donn_es _ __.csv"; filename*=UTF-8''donn%C3%A9es%20%E2%82%AC%20%F0%9F%93%8A.csv`],
    ['path separators', '..%2F..%2Fetc%2Fpasswd%5Cx%281%29%2A.csv', 'x(1)*.csv', `attachment; filename="x(1)*.csv"; filename*=UTF-8''x%281%29%2A.csv`],
    ['only separators', '%2F..%2F', 'upload.csv', `attachment; filename="upload.csv"; filename*=UTF-8''upload.csv`],
  ];
  for (const [k, [what, sent, stored, header]] of cases.entries()) {
    it(`${what}: stored as ${JSON.stringify(stored)}, offered back safely`, async () => {
      const res = await withCsrf(alice.agent.post(uploadUrl(alice)), alice.csrf)
        .set('Content-Type', `multipart/form-data; boundary=${BOUNDARY}`)
        .send(body(sent, k));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const r = res.body as UploadResultDto;
      expect(r.version.fileName).toBe(stored);
      const download = await request(t.app).get(`${apiBase(alice)}/datasets/${r.datasetId}/versions/1/original`).set('Cookie', cookie);
      expect(download.status).toBe(200);
      const disposition = download.headers['content-disposition'];
      expect(disposition).toBe(header);
      expect(disposition).not.toMatch(/[\r\n\0]/);
      // The exact name comes back from filename*.
      const ext = /filename\*=UTF-8''([^;\s]+)$/.exec(disposition)![1];
      expect(ext).toMatch(/^[A-Za-z0-9!#$&+\-.^_`|~%]+$/);
      expect(decodeURIComponent(ext)).toBe(stored);
    });
  }
});
