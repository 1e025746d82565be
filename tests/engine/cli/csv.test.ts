import { describe, it, expect } from 'vitest';
import { parseCsvText } from '../../../server/tabular/csv';
import { scanSimpleDecimal } from '../../../server/tabular/csv-fast';
import { createRng } from '../../../server/engine/random';
import { EngineInputError, type EngineColumn } from '../../../server/engine/types';

function column(name: string, columns: EngineColumn[]): EngineColumn {
  const found = columns.find((c) => c.name === name);
  if (!found) throw new Error(`no column ${name}`);
  return found;
}

describe('parseCsvText', () => {
  it('infers numeric columns and reads every missing marker as NaN', () => {
    const table = parseCsvText('x,y\n1.5,NA\n-2e3,n/a\n,3\n NaN ,null\n.5,?\n', 'a.csv');
    expect(table.nRows).toBe(5);
    const x = column('x', table.columns);
    const y = column('y', table.columns);
    expect(x.kind).toBe('numeric');
    expect(y.kind).toBe('numeric');
    if (x.kind !== 'numeric' || y.kind !== 'numeric') return;
    expect(Array.from(x.values)).toEqual([1.5, -2000, Number.NaN, Number.NaN, 0.5]);
    expect(Array.from(y.values)).toEqual([Number.NaN, Number.NaN, 3, Number.NaN, Number.NaN]);
  });

  it('makes a column categorical when any present cell is not a number; levels sorted; missing = -1', () => {
    const table = parseCsvText('c,n\nred,1\nblue,2\n,3\nred,4\n12,5\n', 'b.csv');
    const c = column('c', table.columns);
    expect(c.kind).toBe('categorical');
    if (c.kind !== 'categorical') return;
    expect(c.levels).toEqual(['12', 'blue', 'red']);
    expect(Array.from(c.codes)).toEqual([2, 1, -1, 2, 0]);
  });

  it('does not take hexadecimal or Infinity as numbers', () => {
    const table = parseCsvText('h\n0x10\nInfinity\n', 'c.csv');
    expect(table.columns[0].kind).toBe('categorical');
  });

  it('skips blank lines and a trailing newline', () => {
    const table = parseCsvText('a\n1\n\n2\n\n', 'd.csv');
    expect(table.nRows).toBe(2);
  });

  const bad: [string, string, RegExp][] = [
    ['a row with the wrong field count names file and line', 'a,b\n1,2\n3\n', /e\.csv: line 3 has 1 fields but the header has 2/],
    ['a duplicate header names the column', 'a,b,a\n1,2,3\n', /e\.csv: column name "a" appears twice/],
    ['an empty header cell names its position', 'a,,c\n1,2,3\n', /e\.csv: column 2 has an empty name/],
    ['an empty file', '', /e\.csv: the file is empty/],
    ['a header without rows', 'a,b\n', /e\.csv: the file has a header but no data rows/],
  ];
  for (const [what, text, message] of bad) {
    it(`rejects ${what}`, () => {
      expect(() => parseCsvText(text, 'e.csv')).toThrow(EngineInputError);
      expect(() => parseCsvText(text, 'e.csv')).toThrow(message);
    });
  }
});

describe('the quote-free fast reader', () => {
  // A quote anywhere sends a file through the general reader (papaparse); the same cells must give
  // the same table either way.
  const body = 'a,b,c\n1.5,x,NA\n-2e-3, 7 ,3\r\n\n0.1,y,1e400\n+.5,,12345678901234567890\n';
  it('gives the same table as the general reader', () => {
    const fast = parseCsvText(body, 'f.csv');
    const general = parseCsvText(body.replace('a,b,c', '"a",b,c'), 'f.csv');
    expect(fast).toEqual(general);
    expect(fast.columns.map((c) => c.kind)).toEqual(['numeric', 'categorical', 'categorical']);
  });

  it('reads decimals exactly as Number() does (ECMAScript: correctly rounded)', () => {
    const rng = createRng(5);
    const cells = ['0', '-0', '007.50', '1e22', '1e-22', '123456789012345', '1234567890123456', '.000001', '9007199254740993', '4.35', '1e23', '2.5E+3'];
    for (let k = 0; k < 2000; k++) {
      const v = (rng.normal() * 10 ** (rng.int(20) - 10));
      cells.push(v.toPrecision(1 + rng.int(17)), String(v), v.toFixed(rng.int(12)));
    }
    for (const cell of cells) {
      const bytes = Buffer.from(`${cell},`);
      const fast = scanSimpleDecimal(bytes, 0);
      const expected = Number(cell);
      // The fast path may decline (NaN) and leave the cell to Number(); when it answers, it must agree.
      if (!Number.isNaN(fast)) expect(Object.is(fast, expected), `cell "${cell}": expected ${expected}, got ${fast}`).toBe(true);
    }
  });

  it('gives the same table as the general reader with missing, text, blank and odd cells anywhere in a row', () => {
    const rng = createRng(11);
    const odd = ['NA', '', ' 7 ', '+3', 'n/a', '?', '1e400', 'x', '12345678901234567', '2.5E-3', '-0', '.5', '5.'];
    for (let t = 0; t < 40; t++) {
      const p = 1 + rng.int(6);
      const lines = [Array.from({ length: p }, (_, j) => `c${j}`).join(',')];
      for (let r = 0; r < 1 + rng.int(30); r++) {
        if (rng.int(8) === 0) lines.push(['', ' ', '\t'][rng.int(3)]);
        lines.push(Array.from({ length: p }, () => (rng.int(4) === 0 ? odd[rng.int(odd.length)] : (rng.normal() * 100).toFixed(rng.int(6)))).join(','));
      }
      const body = `${lines.join('\n')}${rng.int(2) === 0 ? '\n' : ''}`;
      const general = body.replace('c0', '"c0"'); // a quote sends the file to the general reader
      let fast: unknown;
      let expected: unknown;
      try {
        fast = parseCsvText(body, 'r.csv');
      } catch (error) {
        fast = (error as Error).message;
      }
      try {
        expected = parseCsvText(general, 'r.csv');
      } catch (error) {
        expected = (error as Error).message;
      }
      expect(fast, body).toEqual(expected);
    }
  });

  it('names the line of a row with the wrong field count after blank lines and missing cells', () => {
    expect(() => parseCsvText('a,b,c\n1,NA,3\n\n4,,6\n7,8\n', 'h.csv')).toThrow(/h\.csv: line 5 has 2 fields but the header has 3/);
    expect(() => parseCsvText('a,b,c\n1,NA,3\n4,5,6,x\n', 'h.csv')).toThrow(/h\.csv: line 3 has 4 fields but the header has 3/);
    expect(() => parseCsvText('a,b\n1,2\n3', 'h.csv')).toThrow(/h\.csv: line 3 has 1 fields but the header has 2/);
  });

  it('names the line of a row with too many fields', () => {
    expect(() => parseCsvText('a,b\n1,2\n3,4,5\n', 'g.csv')).toThrow(/g\.csv: line 3 has 3 fields but the header has 2/);
  });
});
