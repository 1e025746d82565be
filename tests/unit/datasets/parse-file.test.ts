/**
 * The streaming parser over files larger than one read chunk (1 MB): multi-byte characters and
 * quoted fields with newlines crossing chunk boundaries must come out intact, and the row count
 * must equal the number of rows written. Expected values are those the test itself writes.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_MISSING_MARKERS } from '../../../shared/datasets';
import { inferColumn } from '../../../server/datasets/parse/infer';
import { missingTest } from '../../../server/datasets/parse/missing';
import { parseCsvFile } from '../../../server/datasets/parse/parse-file';
import { ColumnSpill } from '../../../server/datasets/parse/spill';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lariat-parse-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function parse(name: string, content: string | Buffer, columnLimit = 100) {
  const filePath = path.join(dir, name);
  fs.writeFileSync(filePath, content);
  return parseCsvFile({ filePath, fileName: name, missingMarkers: [...DEFAULT_MISSING_MARKERS], columnLimit, spillPath: `${filePath}.spill` });
}

describe('parseCsvFile', () => {
  it('keeps 3 MB of multi-byte text and quoted newlines intact across chunk boundaries', async () => {
    const n = 40_000;
    const rows = Array.from({ length: n }, (_, i) => `${i},"línea ${i}\nsegunda, ☃",${i % 3 === 0 ? 'NA' : (i * 0.25).toString()}`);
    const parsed = await parse('big.csv', `id,text,x\n${rows.join('\n')}\n`);
    try {
      expect(parsed.rowCount).toBe(n);
      const text = parsed.spill.readCells(1);
      expect(text.length).toBe(n);
      for (const i of [0, 1, 12_345, n - 1]) expect(text[i]).toBe(`línea ${i}\nsegunda, ☃`);
      expect(parsed.profiles[2].missing).toBe(Math.ceil(n / 3));
      expect(inferColumn(parsed.profiles[2]).type).toBe('numeric');
      expect(inferColumn(parsed.profiles[0]).type).toBe('identifier');
    } finally {
      parsed.spill.close();
    }
  });

  it('reads thousands of columns', async () => {
    const p = 3000;
    const header = Array.from({ length: p }, (_, j) => `c${j}`).join(',');
    const row = (i: number) => Array.from({ length: p }, (_, j) => String(i * p + j)).join(',');
    const parsed = await parse('wide.csv', `${header}\n${row(0)}\n${row(1)}\n${row(2)}\n`, 5000);
    try {
      expect(parsed.header.length).toBe(p);
      expect(Array.from(parsed.spill.readNumbers(p - 1))).toEqual([p - 1, 2 * p - 1, 3 * p - 1]);
    } finally {
      parsed.spill.close();
    }
  });

  it('refuses more columns than the limit, naming the counts', async () => {
    await expect(parse('wide2.csv', 'a,b,c,d\n1,2,3,4\n', 3)).rejects.toThrow(/wide2\.csv has 4 columns; the limit is 3/);
  });

  it('reports invalid UTF-8 on the right line even past the first chunk', async () => {
    const good = 'a,b\n' + '1,2\n'.repeat(300_000); // 1.2 MB: the bad byte is in the second read chunk
    await expect(parse('late.csv', Buffer.concat([Buffer.from(good), Buffer.from([0xff, 0x2c, 0x31, 0x0a])]))).rejects.toThrow(/late\.csv, line 300002: the text is not valid UTF-8 \(byte 0xFF\)/);
  });

  it('a column that turns to text after a numeric batch reads back as text, numbers in shortest form', () => {
    const spill = new ColumnSpill(path.join(dir, 'mixed.spill'), 2, missingTest(['', 'NA']));
    try {
      spill.writeBatch([['1.50', '7'], ['NA', '8']], () => true);
      spill.writeBatch([['x', '9'], ['2', ' NA ']], (j) => j === 1);
      expect(spill.readCells(0)).toEqual(['1.5', null, 'x', '2']);
      expect(spill.mixed(0)).toBe(true);
      expect(spill.allNumbers(1)).toBe(true);
      expect(Array.from(spill.readNumbers(1))).toEqual([7, 8, 9, Number.NaN]);
    } finally {
      spill.close();
    }
  });
});
