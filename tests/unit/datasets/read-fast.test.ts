/**
 * The quote-free reader against papaparse: every file here is read by both, and everything the
 * ingest keeps (header, counts, profiles, spilled cells and numbers, error messages) must be equal.
 * papaparse is the reference (an independent, widely used CSV parser); the cell scanner's numbers
 * are compared with V8's Number(), a correctly rounded decimal reader.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_MISSING_MARKERS } from '../../../shared/datasets';
import { parseCsvFile, type ParsedFile, type Reader } from '../../../server/datasets/parse/parse-file';
import { isQuoteFree } from '../../../server/datasets/parse/read-fast';
import { scanCell, scanned } from '../../../server/tabular/csv-scan';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lariat-fast-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

let files = 0;
function write(content: string | Buffer, name = 'f.csv'): string {
  const filePath = path.join(dir, `${files++}-${name}`);
  fs.writeFileSync(filePath, content);
  return filePath;
}

function parse(filePath: string, reader: Reader, markers: string[] = [...DEFAULT_MISSING_MARKERS]) {
  return parseCsvFile({ filePath, fileName: path.basename(filePath), missingMarkers: markers, columnLimit: 5000, spillPath: `${filePath}.${reader}.spill`, reader });
}

/** Everything the ingest reads from a parsed file, in plain values. */
function contents(p: ParsedFile) {
  return {
    header: p.header,
    rowCount: p.rowCount,
    blank: p.blankLinesSkipped,
    delimiter: p.delimiter,
    bom: p.byteOrderMark,
    profiles: p.profiles.map((f) => ({ ...f, distinct: [...f.distinctValues], count: f.distinctCount })),
    columns: p.header.map((_, j) => ({
      allNumbers: p.spill.allNumbers(j),
      mixed: p.spill.mixed(j),
      numbers: p.spill.allNumbers(j) ? Array.from(p.spill.readNumbers(j), (x) => (Object.is(x, -0) ? '-0' : x)) : null,
      cells: p.spill.readCells(j),
    })),
  };
}

async function bothReaders(content: string | Buffer, name?: string, markers?: string[]) {
  const filePath = write(content, name);
  const fast = await parse(filePath, 'quote-free', markers);
  const general = await parse(filePath, 'papaparse', markers);
  try {
    return { fast: contents(fast), general: contents(general) };
  } finally {
    fast.spill.close();
    general.spill.close();
  }
}

async function messages(content: string | Buffer, name?: string) {
  const filePath = write(content, name);
  const why = (reader: Reader) => parse(filePath, reader).then(
    (p) => (p.spill.close(), 'accepted'),
    (e: Error) => e.message,
  );
  return { fast: await why('quote-free'), general: await why('papaparse') };
}

describe('the quote-free reader gives what papaparse gives', () => {
  it('on numbers in many spellings, missing markers, blanks, text and non-ASCII', async () => {
    const rows = [
      'id,x,y,label,note',
      '1, 1.50 ,-0,north,café ☃',
      '2,.5,1e3,south,  spaced  ',
      '3,1.,-2.5E-3,NA,x',
      '',
      '4,0007,12345678901234567890,east,',
      '5,NA,1e400,west,N/A',
      '   ',
      '6,-.25,+3,north,1.50',
      '7,,0.1234567890123456789,\u00a0east,?',
    ];
    const { fast, general } = await bothReaders(`${rows.join('\n')}\n`);
    expect(fast).toEqual(general);
    expect(general.blank).toBe(2);
  });

  it('on CRLF files with a byte-order mark and without a final newline', async () => {
    const content = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('a,b,c\r\n1,x y,3.25\r\n\r\n2,z,-4\r\n3, w ,5')]);
    const { fast, general } = await bothReaders(content);
    expect(fast).toEqual(general);
    expect(general.bom).toBe(true);
    expect(general.rowCount).toBe(3);
  });

  it('on tab- and semicolon-separated files', async () => {
    for (const [d, name] of [['\t', 't.tsv'], [';', 's.csv']] as const) {
      const content = ['p q r'.split(' ').join(d), ['1', ' 2 ', 'x'].join(d), ['3', '4.5', 'y'].join(d), ''].join('\n');
      const { fast, general } = await bothReaders(content, name);
      expect(fast).toEqual(general);
      expect(general.delimiter).toBe(d);
    }
  });

  it('when a number is a missing-value marker', async () => {
    const { fast, general } = await bothReaders('a,b\n-999,1\n2,-999\n3,4\n', 'm.csv', ['-999', '']);
    expect(fast).toEqual(general);
    expect(general.profiles[0].missing).toBe(1);
  });

  it('on columns that turn to text in a later batch and in the middle of one, across 1 MB read chunks', async () => {
    // 1600 columns make batches of 256 rows; 900 rows of ~7 KB cross several read chunks.
    const p = 1600;
    const header = Array.from({ length: p }, (_, j) => `c${j}`).join(',');
    const lines = [header];
    for (let i = 1; i <= 900; i++) {
      const cells = Array.from({ length: p }, (_, j) => ((i * 7 + j) % 13 === 0 ? '' : `${(i + j) % 50}.50`));
      if (i === 300) cells[0] = 'text at 300'; // batch 2, row 44 of the batch
      if (i === 256) cells[1] = 'text at 256'; // the last row of batch 1
      if (i === 257) cells[2] = 'text at 257'; // the first row of batch 2
      if (i === 900) cells[p - 1] = 'last';
      lines.push(cells.join(','));
    }
    const { fast, general } = await bothReaders(`${lines.join('\n')}\n`);
    expect(fast).toEqual(general);
    expect(general.columns[0].mixed).toBe(true);
    expect(general.columns[0].cells[299]).toBe('text at 300');
    expect(general.columns[0].cells[260]).toBe('11.50'); // raw: same batch as the text
    expect(general.columns[0].cells[10]).toBe('11.5'); // shortest form: an earlier, all-number batch
  });

  it('on a quoted file, falls back to papaparse and is not quote-free', async () => {
    expect(await isQuoteFree(write('a,b\n"1,5",2\n'))).toBe(false);
    expect(await isQuoteFree(write('a,b\r\n1,2\n3,4\r\n'))).toBe(false); // mixed line endings
    expect(await isQuoteFree(write('a,b\r1,2\r'))).toBe(false); // CR only
    expect(await isQuoteFree(write('a,b\r\n1,2\r\n'))).toBe(true);
    const filePath = write('a,b\n"x, y",2\n3,4\n');
    const parsed = await parseCsvFile({ filePath, fileName: 'q.csv', missingMarkers: [''], columnLimit: 10, spillPath: `${filePath}.spill` });
    try {
      expect(parsed.reader).toBe('papaparse');
      expect(parsed.spill.readCells(0)).toEqual(['x, y', '3']);
    } finally {
      parsed.spill.close();
    }
  });

  it('gives the same messages for ragged rows, bad headers, binary and invalid UTF-8', async () => {
    const bad: (string | Buffer)[] = [
      'a,b,c\n1,2,3\n4,5\n6,7,8\n9,10,11,12\n',
      `a,b\n${'1\n'.repeat(7)}`,
      'a,b\n1,2\n\n3\n',
      'x,y,x\n1,2,3\n',
      '\na,b\n1,2\n',
      'a,b,c\r\n',
      Buffer.from([0x61, 0x2c, 0x62, 0x0a, 0x00, 0x01, 0x02, 0x0a]),
      Buffer.concat([Buffer.from('name,age\nJos'), Buffer.from([0xe9]), Buffer.from(',3\n')]),
    ];
    for (const content of bad) {
      const { fast, general } = await messages(content);
      expect(general, String(content)).not.toBe('accepted');
      expect(fast, String(content)).toBe(general);
    }
  });
});

describe('scanCell', () => {
  const scan = (text: string) => {
    scanCell(Buffer.from(`${text},`), 0, 44);
    return scanned.value;
  };

  it('reads plain decimals exactly as Number() does, or declines', () => {
    // Park & Miller (1988) minimal standard generator for reproducible random spellings.
    let s = 12345;
    const next = () => (s = (s * 16807) % 2147483647) / 2147483647;
    const failures: string[] = [];
    let read = 0;
    for (let k = 0; k < 20_000; k++) {
      const digits = Array.from({ length: 1 + Math.floor(next() * 18) }, () => Math.floor(next() * 10)).join('');
      const dot = Math.floor(next() * (digits.length + 1));
      let text = `${next() < 0.3 ? '-' : ''}${digits.slice(0, dot)}.${digits.slice(dot)}`;
      if (next() < 0.3) text += `e${Math.floor(next() * 50) - 25}`;
      const got = scan(text);
      if (Number.isNaN(got)) continue; // declined: the general path reads it
      read++;
      if (!Object.is(got, Number(text))) failures.push(`${text}: expected ${Number(text)}, got ${got}`);
    }
    expect(failures.slice(0, 5)).toEqual([]);
    expect(read).toBeGreaterThan(10_000);
  });

  it('declines what is not a plain decimal', () => {
    for (const text of ['', '.', '-', '1e', 'e5', '0x10', '1;5', '12a', 'Infinity', '1_000', '١٢']) expect(scan(text), text).toBeNaN();
    expect(scan('  -1.5e2  ')).toBe(-150);
  });
});
