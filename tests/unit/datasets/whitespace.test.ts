/**
 * Files whose columns are separated by runs of spaces (exports of older statistical tools): the
 * tokenizer, the sniffer's choice between those runs and the usual delimiters, and whole files read
 * with and without a header row. Inputs are written here in those shapes; expected values are read
 * off them by hand.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_MISSING_MARKERS } from '../../../shared/datasets';
import { inferColumn } from '../../../server/datasets/parse/infer';
import { parseCsvFile } from '../../../server/datasets/parse/parse-file';
import { detectDelimiter } from '../../../server/datasets/parse/sniff';
import { splitWhitespace, WHITESPACE } from '../../../server/datasets/parse/whitespace';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lariat-ws-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function parse(name: string, content: string, headerRow = true) {
  const filePath = path.join(dir, name);
  fs.writeFileSync(filePath, content);
  return parseCsvFile({ filePath, fileName: name, missingMarkers: [...DEFAULT_MISSING_MARKERS], columnLimit: 100, spillPath: `${filePath}.spill`, headerRow });
}

const QUOTED_NAMES = ["   'GPA'   'SAT'  'Sex'", '    3.12   1180    M', '    2.85    990    F', '    3.90   1420    F', ''].join('\n');
const NO_HEADER = ['  1.5000  2.0000  -3.2500', '  0.7500  1.0000   4.0000', ' 12.0000  0.2500   0.0000', ''].join('\r\n');

describe('splitWhitespace', () => {
  it('splits at runs of spaces and tabs, keeps quoted tokens whole without their quotes', () => {
    expect(splitWhitespace("   'GPA'   'SAT'  'Sex'")).toEqual(['GPA', 'SAT', 'Sex']);
    expect(splitWhitespace('  1.5\t\t 2   -3  \r')).toEqual(['1.5', '2', '-3']);
    expect(splitWhitespace(`"first name" 'it''s' x`)).toEqual(['first name', "it''s", 'x']);
    // An unmatched quote is an ordinary character.
    expect(splitWhitespace(`'open 12`)).toEqual([`'open`, '12']);
    expect(splitWhitespace('   ')).toEqual([]);
  });
});

describe('detectDelimiter with whitespace-separated columns', () => {
  it('chooses runs of spaces for aligned columns, with or without quoted names', () => {
    expect(detectDelimiter(QUOTED_NAMES, 'grades.txt')).toBe(WHITESPACE);
    expect(detectDelimiter(NO_HEADER, 'matrix.dat')).toBe(WHITESPACE);
    expect(detectDelimiter('a b c\n1 2 3\n4 5 6\n', 'x.txt')).toBe(WHITESPACE);
  });

  it('keeps the usual delimiters when they explain the file as well', () => {
    expect(detectDelimiter('a, b, c\n1, 2, 3\n4, 5, 6\n', 'x.csv')).toBe(',');
    expect(detectDelimiter('name,city\nAnn Lee,New York\nBo Li,Rome\n', 'x.csv')).toBe(',');
    expect(detectDelimiter('a\tb\tc\n1 x\t2\t3\n', 'x.tsv')).toBe('\t');
    expect(detectDelimiter('a\tb\tc\n1 x\t2\t3\n4 y\t5\t6\n', 'x.txt')).toBe('\t');
    expect(detectDelimiter('a;b\n1;2\n', 'x.csv')).toBe(';');
    // One column only: no delimiter and no runs of spaces; the comma default stays.
    expect(detectDelimiter('value\n1\n2\n', 'x.csv')).toBe(',');
  });
});

describe('parseCsvFile on whitespace-separated files', () => {
  it('reads quoted names without their quotes and the rows below them', async () => {
    const parsed = await parse('grades.txt', QUOTED_NAMES);
    try {
      expect(parsed.delimiter).toBe(WHITESPACE);
      expect(parsed.reader).toBe('whitespace');
      expect(parsed.headerRow).toBe(true);
      expect(parsed.header).toEqual(['GPA', 'SAT', 'Sex']);
      expect(parsed.rowCount).toBe(3);
      expect(Array.from(parsed.spill.readNumbers(0))).toEqual([3.12, 2.85, 3.9]);
      expect(Array.from(parsed.spill.readNumbers(1))).toEqual([1180, 990, 1420]);
      expect(parsed.spill.readCells(2)).toEqual(['M', 'F', 'F']);
      expect(parsed.blankLinesSkipped).toBe(0);
    } finally {
      parsed.spill.close();
    }
  });

  it('with no header row: every line is data and columns are column_1, column_2, ...', async () => {
    const parsed = await parse('matrix.dat', NO_HEADER, false);
    try {
      expect(parsed.header).toEqual(['column_1', 'column_2', 'column_3']);
      expect(parsed.headerRow).toBe(false);
      expect(parsed.rowCount).toBe(3);
      expect(Array.from(parsed.spill.readNumbers(0))).toEqual([1.5, 0.75, 12]);
      expect(Array.from(parsed.spill.readNumbers(2))).toEqual([-3.25, 4, 0]);
      expect(parsed.lineEndings).toBe('CRLF');
    } finally {
      parsed.spill.close();
    }
  });

  it('a comma file whose first row is data, through both CSV readers', async () => {
    for (const [name, content] of [
      ['plain.csv', '1,2,x\n3,4,y\n5,6,z\n'],
      ['quoted.csv', '1,2,"x"\n3,4,"y, z"\n5,6,w\n'],
    ]) {
      const parsed = await parse(name, content, false);
      try {
        expect(parsed.reader).toBe(name === 'plain.csv' ? 'quote-free' : 'papaparse');
        expect(parsed.header).toEqual(['column_1', 'column_2', 'column_3']);
        expect(parsed.rowCount).toBe(3);
        expect(Array.from(parsed.spill.readNumbers(0))).toEqual([1, 3, 5]);
      } finally {
        parsed.spill.close();
      }
    }
  });

  it('names the unnamed first column of row names row_name (a header one name short)', async () => {
    const content = ['"GPA" "SAT"', '"1" 3.12 1180', '"2" 2.85 990', '', '"3" 3.90 1420', ''].join('\n');
    expect(detectDelimiter(content, 'r-export.txt')).toBe(WHITESPACE);
    const parsed = await parse('r-export.txt', content);
    try {
      expect(parsed.header).toEqual(['row_name', 'GPA', 'SAT']);
      expect(parsed.rowCount).toBe(3);
      expect(parsed.blankLinesSkipped).toBe(1);
      expect(Array.from(parsed.spill.readNumbers(0))).toEqual([1, 2, 3]);
      expect(Array.from(parsed.spill.readNumbers(2))).toEqual([1180, 990, 1420]);
    } finally {
      parsed.spill.close();
    }
    // A header of names alone is still refused for having no rows.
    await expect(parse('names-only.txt', "'a' 'b'\n\n")).rejects.toThrow('names-only.txt has a header row but no data rows.');
  });

  it('names rows from the first line when there is no header', async () => {
    const parsed = await parse('mixed.txt', '1 2\n3 4\n5 x\n', false);
    try {
      expect(inferColumn(parsed.profiles[1]).reason).toMatch(/"x" in row 3 \(the first line is row 1\) is not a number/);
    } finally {
      parsed.spill.close();
    }
    await expect(parse('ragged.txt', '1 2\n3 4 5\n6 7\n', false)).rejects.toThrow(
      'ragged.txt: row 2 (the first line is row 1) does not have 2 fields like the first row. Check for unquoted delimiters inside values or missing fields.',
    );
  });
});
