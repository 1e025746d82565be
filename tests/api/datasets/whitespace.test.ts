/**
 * Uploads of text files whose columns are separated by runs of spaces, in the shapes older
 * statistical tools export: quoted names ('GPA'), aligned numbers, no header row. Files are written
 * here; expected values are read off them by hand.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UploadResultDto, VersionDetailDto } from '../../../shared/datasets';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, type Session } from '../../support/session';
import { apiBase, closeApp, upload } from './support';

let t: TestApp;
let alice: Session;

beforeAll(async () => {
  t = await startTestApp();
  alice = await signUp(t.app);
});
afterAll(async () => closeApp(t));

async function version(r: UploadResultDto): Promise<VersionDetailDto> {
  const res = await alice.agent.get(`${apiBase(alice)}/datasets/${r.datasetId}/versions/${r.version.number}`);
  expect(res.status).toBe(200);
  return res.body as VersionDetailDto;
}

const GRADES = ["   'GPA'    'SAT'   'Hours'", '    3.12     1180      12', '    2.85      990       4', '    3.90     1420      20', '    3.40     1300      15', ''].join('\n');
const MATRIX = ['   1.0000   2.5000  -1.0000', '   2.0000   3.5000   0.5000', '   3.0000   1.5000   2.0000', ''].join('\n');

describe('whitespace-separated uploads', () => {
  it("stores a file with quoted names like 'GPA', names without their quotes", async () => {
    const res = await upload(alice, GRADES, 'grades.txt', { name: 'Grades' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const v = await version(res.body as UploadResultDto);
    expect(v.columns.map((c) => c.name)).toEqual(['GPA', 'SAT', 'Hours']);
    expect(v.rowCount).toBe(4);
    // mean GPA = (3.12 + 2.85 + 3.90 + 3.40) / 4 = 13.27 / 4 (by hand)
    expect(v.columns[0].summary.mean).toBeCloseTo(13.27 / 4, 12);
    expect(v.report).toMatchObject({ delimiter: 'whitespace', headerRow: true, rowCount: 4, columnCount: 3 });
    expect(v.report.notes[0]).toBe('Delimiter: runs of spaces or tabs (detected).');
  });

  it('stores a file without a header row when the uploader says the first row is data', async () => {
    const res = await upload(alice, MATRIX, 'matrix.dat', { name: 'Matrix', headerRow: 'no' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const v = await version(res.body as UploadResultDto);
    expect(v.columns.map((c) => c.name)).toEqual(['column_1', 'column_2', 'column_3']);
    expect(v.rowCount).toBe(3);
    expect(v.columns[2].summary).toMatchObject({ min: -1, max: 2, count: 3, missing: 0 });
    expect(v.report.headerRow).toBe(false);
    expect(v.report.notes).toContain('The first row was read as data, as the uploader chose: the columns are named column_1 to column_3.');
    const rows = await alice.agent.get(`${apiBase(alice)}/datasets/${v.datasetId}/versions/1/rows`);
    expect(rows.body.rows[0]).toEqual([1, 2.5, -1]);
  });

  it('without that choice, a first row of numbers is taken as names, and the report says how to change it', async () => {
    const res = await upload(alice, MATRIX.replace('1.0000', '1.00000'), 'matrix2.dat', { name: 'Matrix as names' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const v = await version(res.body as UploadResultDto);
    expect(v.rowCount).toBe(2);
    expect(v.report.headerRow).toBe(true);
    expect(v.report.notes).toContain('Every name in the first row is a number: if that row is data, upload the file again saying that the first row is data.');
  });

  it('names an unnamed column of row names row_name (a header one name short, as some tools write)', async () => {
    const file = ['"height" "weight"', '"a1" 1.72 68.5', '"a2" 1.80 NA', '"a3" 1.65 59.0', '"a4" 1.90 75.25', ''].join('\n');
    const res = await upload(alice, file, 'measures.txt', { name: 'Measures' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const v = await version(res.body as UploadResultDto);
    expect(v.columns.map((c) => c.name)).toEqual(['row_name', 'height', 'weight']);
    expect(v.columns[2].summary).toMatchObject({ count: 4, missing: 1, min: 59, max: 75.25 });
  });

  it('refuses a headerRow other than yes or no, naming the field', async () => {
    const res = await upload(alice, MATRIX, 'm.dat', { headerRow: 'maybe' });
    expect(res.status).toBe(400);
    expect(res.body.error).toEqual({ message: 'headerRow: headerRow must be "yes" or "no".', field: 'headerRow' });
  });
});
