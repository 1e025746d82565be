/**
 * Uploading CSV/TSV: parsing features (quotes with delimiters and newlines, BOM, CRLF, tabs, missing
 * markers), inferred types with reasons, versions N+1, duplicates, originals byte for byte.
 * Expected values are worked out by hand from the small inputs written in each test.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UploadResultDto, VersionDetailDto } from '../../../shared/datasets';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, withCsrf, type Session } from '../../support/session';
import { closeApp, apiBase, tableCounts, upload, uploadUrl } from './support';

let t: TestApp;
let alice: Session;

beforeAll(async () => {
  t = await startTestApp();
  alice = await signUp(t.app);
});
afterAll(async () => closeApp(t));

const SAMPLE =
  '\uFEFFid,age,city,smoker,comment\r\n' +
  '1,34,"Paris, FR",yes,"said ""hi""\r\nthen left"\r\n' +
  '2,NA,Lyon,no,fine\r\n' +
  '3,12.5,Paris,yes,ok\r\n' +
  '4,,Lyon,no,?\r\n' +
  '5,40,Nice,yes,good\r\n';

async function version(s: Session, r: UploadResultDto, n = r.version.number): Promise<VersionDetailDto> {
  const res = await s.agent.get(`${apiBase(s)}/datasets/${r.datasetId}/versions/${n}`);
  expect(res.status).toBe(200);
  return res.body as VersionDetailDto;
}

describe('CSV upload', () => {
  it('stores version 1 with types, reasons, missing values and the parse report', async () => {
    const res = await upload(alice, SAMPLE, 'people.csv', { name: 'People', description: 'five rows' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const r = res.body as UploadResultDto;
    expect(r.duplicate).toBe(false);
    expect(r.version).toMatchObject({ number: 1, rowCount: 5, columnCount: 5, fileName: 'people.csv', origin: 'upload' });
    const v = await version(alice, r);
    const byName = Object.fromEntries(v.columns.map((c) => [c.name, c]));
    expect(byName.id.type).toBe('identifier');
    expect(byName.id.excluded).toBe(true);
    expect(byName.id.reason).toMatch(/row number/);
    expect(byName.age.type).toBe('numeric');
    expect(byName.age.summary).toMatchObject({ count: 5, missing: 2, min: 12.5, max: 40 });
    // mean of 34, 12.5, 40 = 86.5 / 3 (by hand)
    expect(byName.age.summary.mean).toBeCloseTo(86.5 / 3, 12);
    expect(byName.city.type).toBe('categorical');
    expect(byName.city.summary.levels).toEqual([
      { level: 'Lyon', count: 2 },
      { level: 'Nice', count: 1 },
      { level: 'Paris', count: 1 },
      { level: 'Paris, FR', count: 1 },
    ]);
    expect(byName.smoker.type).toBe('binary');
    expect(byName.comment.summary.missing).toBe(1);
    expect(v.report).toMatchObject({ delimiter: ',', byteOrderMark: true, lineEndings: 'CRLF', rowCount: 5 });
    expect(v.report.notes.join('\n')).toMatch(/Column "id" is left out of modelling/);

    const rows = await alice.agent.get(`${apiBase(alice)}/datasets/${r.datasetId}/versions/1/rows?limit=10`);
    expect(rows.body.rows[0]).toEqual([1, 34, 'Paris, FR', 'yes', 'said "hi"\r\nthen left']);
    expect(rows.body.rows[1][1]).toBeNull();
  });

  it('detects tabs and semicolons, and honours missing markers given with the upload', async () => {
    const tsv = await upload(alice, 'x\ty\n1\t-\n2\t5\n3\t7\n4\t9\n', 'tabs.tsv', { missing: '-' });
    expect(tsv.status, JSON.stringify(tsv.body)).toBe(201);
    const v = await version(alice, tsv.body as UploadResultDto);
    expect(v.report.delimiter).toBe('\t');
    expect(v.columns[1]).toMatchObject({ name: 'y', type: 'numeric' });
    expect(v.columns[1].summary.missing).toBe(1);
    const semi = await upload(alice, 'a;b\n1,5;x\n2,5;y\n', 'semi.csv');
    expect(semi.status, JSON.stringify(semi.body)).toBe(201);
    expect((await version(alice, semi.body as UploadResultDto)).report.delimiter).toBe(';');
  });

  it('adds version N+1 for a new file and recognises an identical one without storing it', async () => {
    const first = (await upload(alice, 'u,v\n1,2\n3,4\n', 'pairs.csv', { name: 'Pairs' })).body as UploadResultDto;
    const second = await upload(alice, 'u,v\n1,2\n3,5\n', 'pairs.csv', { datasetId: first.datasetId });
    expect(second.status).toBe(201);
    expect(second.body.version.number).toBe(2);
    const before = await tableCounts(t);
    const again = await upload(alice, 'u,v\n1,2\n3,4\n', 'pairs-copy.csv', { datasetId: first.datasetId });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ duplicate: true, version: { number: 1 } });
    expect(again.body.message).toMatch(/identical to version 1/);
    expect(await tableCounts(t)).toEqual(before);
    const detail = await alice.agent.get(`${apiBase(alice)}/datasets/${first.datasetId}`);
    expect(detail.body.versions.map((v: { number: number }) => v.number)).toEqual([1, 2]);
  });

  it('gives back the original file byte for byte', async () => {
    const content = Buffer.from('\uFEFFa,b\r\n"x,1",2\r\n', 'utf8');
    const r = (await upload(alice, content, 'orig.csv')).body as UploadResultDto;
    const res = await alice.agent.get(`${apiBase(alice)}/datasets/${r.datasetId}/versions/1/original`).buffer(true).parse((resp, cb) => {
      const parts: Buffer[] = [];
      resp.on('data', (c: Buffer) => parts.push(c));
      resp.on('end', () => cb(null, Buffer.concat(parts)));
    });
    expect(res.status).toBe(200);
    expect(Buffer.compare(res.body as Buffer, content)).toBe(0);
    expect(res.headers['content-disposition']).toContain('orig.csv');
  });

  it('reports progress under the ingest id the client chose', async () => {
    const ingest = randomUUID();
    const content = 'k,v\n' + Array.from({ length: 300 }, (_, i) => `${i % 7},${i * 0.5}`).join('\n') + '\n';
    const res = await withCsrf(alice.agent.post(uploadUrl(alice, ingest)), alice.csrf).attach('file', Buffer.from(content), 'progress.csv');
    expect(res.status).toBe(201);
    const p = await alice.agent.get(`${apiBase(alice)}/ingests/${ingest}`);
    expect(p.body).toMatchObject({ id: ingest, phase: 'done', fraction: 1, bytesReceived: content.length, rowsParsed: 300 });
    const other = await signUp(t.app);
    expect((await other.agent.get(`${apiBase(other)}/ingests/${ingest}`)).status).toBe(404);
  });
});
