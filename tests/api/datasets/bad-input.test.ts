/**
 * Bad uploads: each gets a 4xx whose message names the file and the row or column at fault, and
 * leaves every datasets table exactly as it was (no partial dataset, upload or version).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UploadResultDto } from '../../../shared/datasets';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, withCsrf, type Session } from '../../support/session';
import { closeApp, apiBase, tableCounts, upload, uploadUrl } from './support';

let t: TestApp;
let alice: Session;
let existing: UploadResultDto;

beforeAll(async () => {
  t = await startTestApp();
  alice = await signUp(t.app);
  existing = (await upload(alice, 'a,b\n1,2\n3,4\n5,6\n', 'good.csv', { name: 'Good' })).body as UploadResultDto;
});
afterAll(async () => closeApp(t));

const cases: { what: string; file: string; content: string | Buffer; message: RegExp }[] = [
  { what: 'an empty file', file: 'empty.csv', content: '', message: /empty\.csv is empty/ },
  { what: 'a header with no rows', file: 'header.csv', content: 'a,b,c\r\n', message: /header\.csv has a header row but no data rows/ },
  { what: 'duplicate column names', file: 'dup.csv', content: 'x,y,x\n1,2,3\n', message: /dup\.csv: the column name "x" appears twice .*columns 1 and 3/ },
  { what: 'a blank column name', file: 'blank.csv', content: 'x, ,z\n1,2,3\n', message: /blank\.csv: column 2 has no name/ },
  { what: 'ragged rows', file: 'ragged.csv', content: 'a,b,c\n1,2,3\n4,5\n6,7,8\n9,10,11,12\n', message: /ragged\.csv: rows 3, 5 \(the header is row 1\) do not have 3 fields/ },
  { what: 'binary content', file: 'sheet.csv', content: Buffer.from([0x61, 0x2c, 0x62, 0x0a, 0x00, 0x01, 0x02, 0x0a]), message: /sheet\.csv contains binary data \(a NUL byte on line 2\)/ },
  { what: 'a ZIP or workbook', file: 'book.csv', content: Buffer.from('PK\u0003\u0004rest-of-a-zip', 'latin1'), message: /book\.csv is a ZIP archive or a spreadsheet workbook/ },
  { what: 'invalid UTF-8', file: 'latin1.csv', content: Buffer.concat([Buffer.from('name,age\nJos'), Buffer.from([0xe9]), Buffer.from(',3\n')]), message: /latin1\.csv, line 2: the text is not valid UTF-8 \(byte 0xE9\)/ },
  { what: 'a single column', file: 'one.csv', content: 'only\n1\n2\n', message: /one\.csv has a single column \("only"\)/ },
  { what: 'an unclosed quote', file: 'quote.csv', content: 'a,b\n1,"open\n2,3\n', message: /quote\.csv, row 2 \(the header is row 1\): a quoted field is never closed/ },
];

describe('bad uploads', () => {
  for (const c of cases) {
    it(`refuses ${c.what} with a message naming the file, and stores nothing`, async () => {
      const before = await tableCounts(t);
      const res = await upload(alice, c.content, c.file);
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(res.body.error.message).toMatch(c.message);
      expect(res.body.error.field).toBe('file');
      expect(await tableCounts(t)).toEqual(before);
    });
  }

  it('refuses a bad new version without touching the versions already stored', async () => {
    const before = await tableCounts(t);
    const res = await upload(alice, 'a,b\n1,2\n3\n', 'bad-v2.csv', { datasetId: existing.datasetId });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/bad-v2\.csv: row 3 \(the header is row 1\) does not have 2 fields/);
    expect(await tableCounts(t)).toEqual(before);
    const detail = await alice.agent.get(`${apiBase(alice)}/datasets/${existing.datasetId}`);
    expect(detail.body.versions).toHaveLength(1);
    expect(detail.body.versions[0].sha256).toBe(existing.version.sha256);
  });

  it('refuses a request without a file part and bad form fields', async () => {
    const noFile = await withCsrf(alice.agent.post(uploadUrl(alice)), alice.csrf).field('name', 'No file');
    expect(noFile.status).toBe(400);
    expect(noFile.body.error.message).toMatch(/No file in the upload/);
    const json = await withCsrf(alice.agent.post(uploadUrl(alice)), alice.csrf).send({ name: 'x' });
    expect(json.status).toBe(400);
    expect(json.body.error.message).toMatch(/multipart\/form-data/);
    const bad = await upload(alice, 'p,q\n1,2\n', 'x.csv', { datasetId: 'not-an-id' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('datasetId');
  });

  it('neutralises spreadsheet formulas in the cleaned CSV but keeps negative numbers', async () => {
    const csv = 'label,value,note\n=SUM(A1:A2),-3.5,+1\n@cmd,2,-x\nplain,-1,ok\n';
    const r = (await upload(alice, csv, 'formulas.csv')).body as UploadResultDto;
    const res = await alice.agent.get(`${apiBase(alice)}/datasets/${r.datasetId}/versions/1/cleaned.csv`);
    expect(res.status).toBe(200);
    const lines = res.text.trim().split('\r\n');
    // OWASP "CSV Injection": prefix a single quote to cells starting with = + - @ tab CR.
    expect(lines).toEqual(['label,value,note', "'=SUM(A1:A2),-3.5,'+1", "'@cmd,2,'-x", 'plain,-1,ok']);
  });
});
