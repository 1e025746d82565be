/**
 * The header row is checked while streaming: a first line far longer than any row of names, or with
 * more fields than the column limit, is refused after reading at most HEADER_BYTE_LIMIT bytes; a
 * normal header is scanned to its end and no further.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_MISSING_MARKERS } from '../../../shared/datasets';
import { checkFirstLine, HEADER_BYTE_LIMIT } from '../../../server/datasets/parse/first-line';
import { parseCsvFile } from '../../../server/datasets/parse/parse-file';
import { WHITESPACE } from '../../../server/datasets/parse/whitespace';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lariat-first-line-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function write(name: string, content: string | Buffer): string {
  const filePath = path.join(dir, name);
  fs.writeFileSync(filePath, content);
  return filePath;
}

describe('the first line', () => {
  it('of 8 MB without a line break is refused after at most the header limit', async () => {
    const names = Array.from({ length: 1_000_000 }, (_, j) => `c${j}`).join(',');
    const filePath = write('endless.csv', `${names}\n1\n`);
    const message = 'endless.csv: the first line is longer than 1 MB without a line break, far longer than a row of column names; check that the file is text with one row per line.';
    await expect(checkFirstLine(filePath, 'endless.csv', ',', 5000)).rejects.toThrow(message);
    await expect(parseCsvFile({ filePath, fileName: 'endless.csv', missingMarkers: [...DEFAULT_MISSING_MARKERS], columnLimit: 5000, spillPath: `${filePath}.spill` })).rejects.toThrow(message);
    expect(fs.existsSync(`${filePath}.spill`)).toBe(false);
  });

  it('with more fields than the limit gives the exact count, quotes respected', async () => {
    // "a,b" and "d""e,f" are one field each: 4 fields.
    const header = '"a,b",c,"d""e,f",g';
    const filePath = write('wide.csv', `${header}\n1,2,3,4\n`);
    await expect(checkFirstLine(filePath, 'wide.csv', ',', 3)).rejects.toThrow('wide.csv has 4 columns; the limit is 3.');
    await expect(checkFirstLine(filePath, 'wide.csv', ',', 4)).resolves.toEqual({ fields: 4, bytesScanned: header.length });
  });

  it('is scanned to its end and no further, after a byte-order mark, for every separator', async () => {
    const body = `${'1,2,3\n'.repeat(100_000)}`;
    const csv = write('bom.csv', Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(`"x",y,z\n${body}`)]));
    expect(await checkFirstLine(csv, 'bom.csv', ',', 10)).toEqual({ fields: 3, bytesScanned: 3 + '"x",y,z'.length });
    const ws = write('ws.txt', "  'GPA'   'SAT'\t 'Sex'  \r\n 3.1 1200 M\n");
    expect(await checkFirstLine(ws, 'ws.txt', WHITESPACE, 10)).toEqual({ fields: 3, bytesScanned: "  'GPA'   'SAT'\t 'Sex'  \r".length });
    expect(await checkFirstLine(write('one.csv', 'a,b'), 'one.csv', ',', 10)).toEqual({ fields: 2, bytesScanned: 3 });
  });

  it('at exactly the limit, without a line break, in a file no longer: accepted as a one-line file would be', async () => {
    const filePath = write('edge.csv', `${'x'.repeat(HEADER_BYTE_LIMIT - 2)},y`);
    expect(await checkFirstLine(filePath, 'edge.csv', ',', 10)).toEqual({ fields: 2, bytesScanned: HEADER_BYTE_LIMIT });
  });
});
