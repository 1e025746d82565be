/**
 * The quote-free reader's inline decimal path against Number() (ECMAScript requires it to be
 * correctly rounded). The inline path takes a cell only when it is exact by Clinger's argument
 * (W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990): at most 15 digits, so
 * the integer is below 2^53, times or divided by 10^k with |k| <= 22, an exact binary64 power; one
 * correctly rounded operation then gives the correctly rounded value. Every other cell falls back to
 * Number(). The cells here cover random digit counts, signs, exponents, leading and trailing zeros,
 * -0 and the 15/16-digit edge; two deliberately wrong variants of the arithmetic are shown to fail on
 * the same cells, so these checks can catch a fast path that rounds wrong.
 */
import { describe, expect, it } from 'vitest';
import { parseCsvText } from '../../../server/tabular/csv';
import { readPlainRowsForTest } from '../../../server/tabular/csv-fast';
import { createRng, type Rng } from '../../../server/engine/random';

function digitString(rng: Rng, count: number): string {
  let s = '';
  for (let k = 0; k < count; k++) s += String(rng.int(10));
  return s;
}

/** A decimal with `digits` digits (leading zeros included), a random point, sign and exponent. */
function randomDecimal(rng: Rng, digits: number, maxExponent: number): string {
  let body = digitString(rng, digits);
  // Leading or trailing zeros in a quarter of the cells each: they count as digits for the inline path.
  if (rng.int(4) === 0) body = `0${body.slice(1)}`;
  if (rng.int(4) === 0) body = `${body.slice(0, -1)}0`;
  const point = rng.int(digits + 2) - 1; // -1: no point
  let cell = point < 0 ? body : `${body.slice(0, point)}.${body.slice(point)}`;
  if (rng.int(3) === 0) {
    const e = rng.int(2 * maxExponent + 1) - maxExponent;
    const sign = e < 0 ? '-' : ['', '+'][rng.int(2)];
    cell += `${['e', 'E'][rng.int(2)]}${sign}${Math.abs(e)}`;
  }
  return rng.int(2) === 0 ? `-${cell}` : cell;
}

/** Cells at the edges: -0, exact powers, the 15-digit limit, halfway cases only the fallback gets right. */
const EDGE_CELLS = [
  '0', '-0', '-0.0', '-.0', '0.000', '-0e5', '5.', '.5', '5.e3', '007.50', '1e22', '1e-22', '-1E+22', '9e22',
  '0.1', '0.2', '0.3', '2.675', '1.005', '4.35', '8.589973e9', '123456789012345', '999999999999999',
  '0.999999999999999', '-99999999999999.9', '9.99999999999999e22', '1.23456789012345e-22',
  // 16 and 17 significant digits: only the fallback reads these correctly (integers past 2^53, ties).
  '1234567890123456', '9007199254740993', '9007199254740995', '0.30000000000000004', '2.2250738585072011e-308',
  '1e23', '1e-23', '179769313486231570000', '4.9e-324', '1.7976931348623157e308', '0.000001', '1e-7',
];

/** A value as text, -0 shown as such (String(-0) is "0"). */
const show = (v: number) => (Object.is(v, -0) ? '-0' : String(v));

/** A CSV with the cells in rows of `p` columns (the last row padded with zeros). */
function csvOf(cells: string[], p: number, lineEnd = '\n'): { text: string; rows: string[][] } {
  const rows: string[][] = [];
  for (let k = 0; k < cells.length; k += p) {
    const row = cells.slice(k, k + p);
    while (row.length < p) row.push('0');
    rows.push(row);
  }
  const header = Array.from({ length: p }, (_, j) => `c${j}`).join(',');
  return { text: `${header}${lineEnd}${rows.map((r) => r.join(',')).join(lineEnd)}${lineEnd}`, rows };
}

/** Every cell of the table equals Number(cell), -0 included (Object.is). */
function expectExact(text: string, rows: string[][], what: string): void {
  const table = parseCsvText(text, 'exact.csv');
  expect(table.nRows).toBe(rows.length);
  const mismatches: string[] = [];
  table.columns.forEach((column, j) => {
    if (column.kind !== 'numeric') {
      mismatches.push(`column ${j} read as ${column.kind}`);
      return;
    }
    rows.forEach((row, i) => {
      if (!Object.is(column.values[i], Number(row[j]))) mismatches.push(`"${row[j]}": expected ${show(Number(row[j]))}, got ${show(column.values[i])}`);
    });
  });
  expect(mismatches.slice(0, 10), `${what}: ${mismatches.length} cells differ from Number()`).toEqual([]);
}

/**
 * The test's own Clinger arithmetic on a cell's text: `maxDigits` digits at most and |k| <= 22, else
 * Number(). `divide` false multiplies by the inexact 10^-k instead of dividing by 10^k.
 */
function clinger(cell: string, maxDigits: number, divide: boolean): number {
  const m = /^(-?)(\d*)\.?(\d*)(?:[eE]([+-]?\d+))?$/.exec(cell);
  if (!m) return Number(cell);
  const digits = m[2] + m[3];
  const k = Number(m[4] ?? 0) - m[3].length;
  if (digits.length > maxDigits || Math.abs(k) > 22) return Number(cell);
  const integer = Number(digits);
  const magnitude = k >= 0 ? integer * 10 ** k : divide ? integer / 10 ** -k : integer * Number(`1e${k}`);
  return m[1] === '-' ? -magnitude : magnitude;
}

describe('the reader gives each cell exactly Number(cell)', () => {
  const rng = createRng(20261202);
  // The inline domain: 1 to 15 digits, powers of ten within +-22 in all.
  const inline: string[] = [];
  for (let k = 0; k < 30000; k++) inline.push(randomDecimal(rng, 1 + rng.int(15), 7));
  // The rest of the grammar: up to 20 digits, exponents far outside +-22.
  const wide: string[] = [];
  for (let k = 0; k < 20000; k++) wide.push(randomDecimal(rng, 1 + rng.int(20), 280)); // finite: 1e20 * 1e280 < 1.8e308

  it('the plain loop takes every row of inline-domain cells and agrees with Number() on each', () => {
    const p = 50;
    const { text, rows } = csvOf(inline, p);
    const body = Buffer.from(text.slice(text.indexOf('\n') + 1));
    const read = readPlainRowsForTest(body, p, rows.length);
    // Cells that leave the inline domain once the point moves (e.g. 14 digits with e-9 and 9 more
    // fraction digits: k = -23) send their row to the careful path; the rest must all be taken.
    expect(read.rows).toBe(rows.length);
    const mismatches: string[] = [];
    for (let i = 0; i < read.rows; i++) {
      for (let j = 0; j < p; j++) {
        const got = read.values[j * rows.length + i];
        if (!Object.is(got, Number(rows[i][j]))) mismatches.push(`"${rows[i][j]}": expected ${show(Number(rows[i][j]))}, got ${show(got)}`);
      }
    }
    expect(mismatches.slice(0, 10)).toEqual([]);
  });

  it('a row of plain cells goes through the plain loop; a 16-digit cell sends it to the careful path', () => {
    expect(readPlainRowsForTest(Buffer.from('1.5,-0,2e-3\n'), 3, 1).rows).toBe(1);
    expect(readPlainRowsForTest(Buffer.from('1.5,-0,2e-3\r\n'), 3, 1).rows).toBe(1);
    expect(readPlainRowsForTest(Buffer.from('1.5,9007199254740993,2\n'), 3, 1).rows).toBe(0);
    expect(readPlainRowsForTest(Buffer.from('1.5,1e23,2\n'), 3, 1).rows).toBe(0);
    expect(readPlainRowsForTest(Buffer.from('1.5, 2,2\n'), 3, 1).rows).toBe(0);
    expect(readPlainRowsForTest(Buffer.from('1.5,2\n'), 3, 1).rows).toBe(0);
  });

  it('whole files: inline-domain cells, wider cells and edge cases, LF and CRLF, narrow and wide rows', () => {
    expectExact(csvOf(inline, 7).text, csvOf(inline, 7).rows, 'inline domain, 7 columns');
    // One column: each row is one cell, so a 16-20 digit cell meets the plain loop's digit limit
    // itself (with many columns nearly every row has some long cell and goes the careful way).
    for (const p of [1, 200]) expectExact(csvOf(wide, p).text, csvOf(wide, p).rows, `up to 20 digits, ${p} columns`);
    for (const p of [1, 3, EDGE_CELLS.length]) {
      const { text, rows } = csvOf(EDGE_CELLS, p);
      expectExact(text, rows, `edge cells, ${p} columns`);
      expectExact(csvOf(EDGE_CELLS, p, '\r\n').text, rows, `edge cells, ${p} columns, CRLF`);
    }
    // No newline after the last row: that row goes through the checked scanner.
    expectExact(csvOf(inline.slice(0, 99), 9).text.trimEnd(), csvOf(inline.slice(0, 99), 9).rows, 'no final newline');
  });

  it('these cells catch a fast path that rounds wrong', () => {
    const cells = [...inline, ...wide, ...EDGE_CELLS];
    const wrong = (rule: (c: string) => number) => cells.filter((c) => !Object.is(rule(c), Number(c))).length;
    // The arithmetic the reader uses agrees everywhere...
    expect(wrong((c) => clinger(c, 15, true))).toBe(0);
    // ...while 17 digits (integers past 2^53 are rounded before the scaling) or multiplying by the
    // inexact 10^-k (two roundings) each give many wrong cells here.
    expect(wrong((c) => clinger(c, 17, true))).toBeGreaterThan(100);
    expect(wrong((c) => clinger(c, 15, false))).toBeGreaterThan(100);
  });
});
