/**
 * A fast reader for the common case of a CSV without quotes: large numeric tables (e.g. 20000 x 200)
 * take seconds through a general parser that builds a string per cell. Here the bytes are scanned
 * once; simple decimals are converted by Clinger's exact fast path (W. D. Clinger, "How to read
 * floating point numbers accurately", PLDI 1990: a mantissa below 2^53 times or divided by an exact
 * power of ten up to 1e22 is correctly rounded in one operation); any other cell goes through the
 * general reader's rule, so both readers give identical tables (tests/engine/cli/csv.test.ts).
 */
import { EngineInputError, type EngineColumn, type EngineTable } from './types';

const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);
const COMMA = 44;
const NEWLINE = 10;
const SPACE = 32;
const TAB = 9;
const CR = 13;

/** Where the last scanned cell ended (the delimiter's position); avoids allocating a result pair. */
let cellEnd = 0;

function endOfCell(bytes: Uint8Array, i: number): number {
  while (i < bytes.length && bytes[i] !== COMMA && bytes[i] !== NEWLINE) i++;
  return i;
}

/**
 * Scans one cell from `start` to its delimiter (comma, newline or end), setting `cellEnd`; returns
 * its value when it is a simple decimal (<= 15 significant digits, blanks around it), else NaN.
 */
export function scanSimpleDecimal(bytes: Uint8Array, start: number): number {
  let i = start;
  const n = bytes.length;
  let c = i < n ? bytes[i] : NEWLINE;
  while (c === SPACE) c = ++i < n ? bytes[i] : NEWLINE;
  let sign = 1;
  if (c === 43 || c === 45) {
    if (c === 45) sign = -1;
    c = ++i < n ? bytes[i] : NEWLINE;
  }
  let mantissa = 0;
  let digits = 0;
  let exponent = 0;
  let sawDigit = false;
  let ok = true;
  for (; c >= 48 && c <= 57; c = ++i < n ? bytes[i] : NEWLINE) {
    sawDigit = true;
    if (mantissa === 0 && c === 48) continue;
    if (digits === 15) ok = false;
    else {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
    }
  }
  if (c === 46) {
    for (c = ++i < n ? bytes[i] : NEWLINE; c >= 48 && c <= 57; c = ++i < n ? bytes[i] : NEWLINE) {
      sawDigit = true;
      if (mantissa === 0 && c === 48) exponent--;
      else if (digits === 15) ok = false;
      else {
        mantissa = mantissa * 10 + (c - 48);
        digits++;
        exponent--;
      }
    }
  }
  if (c === 101 || c === 69) {
    c = ++i < n ? bytes[i] : NEWLINE;
    let expSign = 1;
    if (c === 43 || c === 45) {
      if (c === 45) expSign = -1;
      c = ++i < n ? bytes[i] : NEWLINE;
    }
    let e = 0;
    let expDigits = 0;
    for (; c >= 48 && c <= 57; c = ++i < n ? bytes[i] : NEWLINE, expDigits++) e = e * 10 + (c - 48);
    if (expDigits === 0 || expDigits > 4) ok = false;
    exponent += expSign * e;
  }
  while (c === SPACE || c === CR) c = ++i < n ? bytes[i] : NEWLINE;
  if (c !== COMMA && c !== NEWLINE) {
    cellEnd = endOfCell(bytes, i);
    return Number.NaN;
  }
  cellEnd = i;
  if (!ok || !sawDigit) return Number.NaN;
  if (mantissa === 0) return sign * 0;
  if (exponent >= 0 && exponent <= 22) return sign * mantissa * POW10[exponent];
  if (exponent < 0 && exponent >= -22) return (sign * mantissa) / POW10[-exponent];
  return Number.NaN;
}

function isBlankLine(bytes: Uint8Array, i: number): boolean {
  for (; i < bytes.length && bytes[i] !== NEWLINE; i++) {
    const c = bytes[i];
    if (c !== SPACE && c !== TAB && c !== CR) return false;
  }
  return true;
}

function lineEnd(bytes: Uint8Array, i: number): number {
  const end = bytes.indexOf(NEWLINE, i);
  return end < 0 ? bytes.length : end;
}

/** The general reader's per-cell rule: missing -> NaN, decimal -> its value, text -> undefined. */
export type CellRule = (cell: string) => number | undefined;

/**
 * Reads the rows of a quote-free CSV (the caller has checked there is no `"` and read the header),
 * starting at byte `bodyStart`. Same line numbers, blank-line skipping and messages as the general
 * reader; text columns are re-read as strings and built by `toTextColumn`.
 */
export function parseQuoteFreeRows(
  bytes: Uint8Array,
  file: string,
  header: string[],
  bodyStart: number,
  classify: CellRule,
  toTextColumn: (name: string, cells: string[]) => EngineColumn,
): EngineTable {
  const p = header.length;
  const decoder = new TextDecoder();
  let capacity = 1024;
  let values = header.map(() => new Float64Array(capacity));
  const textual = new Uint8Array(p);
  const lineStarts: number[] = [];
  let nRows = 0;
  let line = 1;
  for (let pos = bodyStart; pos < bytes.length; ) {
    line++;
    if (isBlankLine(bytes, pos)) {
      pos = lineEnd(bytes, pos) + 1;
      continue;
    }
    if (nRows === capacity) {
      capacity *= 2;
      values = values.map((v) => {
        const grown = new Float64Array(capacity);
        grown.set(v);
        return grown;
      });
    }
    const start = pos;
    for (let j = 0; j < p; j++) {
      let v = scanSimpleDecimal(bytes, pos);
      const atLineEnd = cellEnd >= bytes.length || bytes[cellEnd] === NEWLINE;
      if (atLineEnd !== (j === p - 1)) {
        const fields = decoder.decode(bytes.subarray(start, lineEnd(bytes, start))).split(',').length;
        throw new EngineInputError(`${file}: line ${line} has ${fields} fields but the header has ${p}`, 'data');
      }
      if (!textual[j] && Number.isNaN(v)) {
        const rule = classify(decoder.decode(bytes.subarray(pos, cellEnd)));
        if (rule === undefined) textual[j] = 1;
        else v = rule;
      }
      values[j][nRows] = v;
      pos = cellEnd + 1;
    }
    lineStarts.push(start);
    nRows++;
  }
  if (nRows === 0) throw new EngineInputError(`${file}: the file has a header but no data rows`, 'data');
  return {
    nRows,
    columns: header.map((name, j): EngineColumn => {
      if (!textual[j]) return { name, kind: 'numeric', values: values[j].slice(0, nRows) };
      // A text column: read its cells again as strings (rare in large files, so done only then).
      const cells = lineStarts.map((start) => decoder.decode(bytes.subarray(start, lineEnd(bytes, start))).split(',')[j]);
      return toTextColumn(name, cells);
    }),
  };
}
