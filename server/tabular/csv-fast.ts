/**
 * A fast reader for the common case of a CSV without quotes: large numeric tables (e.g. 20000 x 200)
 * take seconds through a general parser that builds a string per cell. Here the bytes are scanned
 * once, into columns allocated once at their final length (the rows are counted first: a memchr-like
 * pass, far cheaper than growing and copying every column). A plain decimal cell (optional minus,
 * digits, optional point and digits, at most 15 digits, ended by the expected comma or newline) is
 * converted inline by Clinger's exact fast path (W. D. Clinger, "How to read floating point numbers
 * accurately", PLDI 1990: an integer below 2^53 divided by an exactly representable power of ten,
 * 10^k with k <= 22, is correctly rounded in one operation, so it equals Number(text)). Any other
 * cell (blanks, exponent, CR, text, missing, a field-count error) goes through the shared cell
 * scanner (csv-scan.ts) and the general reader's rule, so both readers give identical tables
 * (tests/engine/cli/csv.test.ts, tests/engine/cli/csv-exact.test.ts).
 */
import { scanCell, scanned } from './csv-scan';
import { EngineInputError, type EngineColumn, type EngineTable } from '../engine/types';

const COMMA = 44;
const NEWLINE = 10;
const SPACE = 32;
const TAB = 9;
const CR = 13;
const MINUS = 45;
const POINT = 46;
const PLUS = 43;
const LOWER_E = 101;
const UPPER_E = 69;
const ZERO = 48;
const NINE = 57;
/**
 * Digits (leading zeros included) the inline path takes: 10^15 - 1 < 2^53, so the integer formed
 * from them, and every partial one, is exact in binary64; with at most 15 fraction digits the power
 * of ten is exact too (10^22 is the largest exact one). Longer cells go to the shared scanner.
 */
const MAX_INLINE_DIGITS = 15;
/** 10^22 is the largest power of ten exact in binary64 (5^22 < 2^53; 5^23 is not). */
const MAX_EXACT_POWER = 22;
/** Longer exponents (e.g. e-00005) are rare enough for the careful path; 4 digits cannot overflow. */
const MAX_EXPONENT_DIGITS = 4;
/** Stateless (no streaming), so one serves every call. */
const decoder = new TextDecoder();
const POW10 = Array.from({ length: MAX_EXACT_POWER + 1 }, (_, k) => 10 ** k);

/**
 * Scans one cell from `start` to its delimiter (comma, newline or end); returns its value when it is
 * a simple decimal (<= 15 significant digits, blanks around it), else NaN. `scanned.end` is the
 * delimiter's position. The scanner is shared with the upload reader (csv-scan.ts).
 */
export function scanSimpleDecimal(bytes: Uint8Array, start: number): number {
  scanCell(bytes, start, COMMA);
  return scanned.value;
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

/** Lines from `start` on (blank ones included): an upper bound on the data rows. */
function countLines(bytes: Uint8Array, start: number): number {
  if (start >= bytes.length) return 0;
  let lines = 0;
  for (let i = bytes.indexOf(NEWLINE, start); i >= 0; i = bytes.indexOf(NEWLINE, i + 1)) lines++;
  return bytes[bytes.length - 1] === NEWLINE ? lines : lines + 1;
}

/** The general reader's per-cell rule: missing -> NaN, decimal -> its value, text -> undefined. */
export type CellRule = (cell: string) => number | undefined;

/**
 * Where the last `readPlainRows` call stopped. A module variable, not an object's field: a field
 * first written when the loop exits made the compiled loop bail out (no type feedback yet).
 */
let plainEnd = 0;
/** The column of the cell at `plainEnd` (0: a row start). */
let plainColumn = 0;

/**
 * The hot loop, kept small so the compiler keeps it tight: reads cells from `pos`, the start of cell
 * `column` of row `row`, while each is a plain decimal (optional minus, digits, optional point and
 * digits, optional exponent; at most 15 digits; a power of ten within 10^+-22) ended by the expected
 * comma, or after the last cell by a newline (CR LF too). Stops at the first other cell (blank line,
 * blanks, a plus sign, more digits, text, missing, a wrong field count), which the careful path
 * then reads: `plainEnd` and `plainColumn` say where it is; returns how many rows it completed. No
 * bounds checks are needed up to `lastNewline`: every scan stops at a non-digit, at the latest at
 * the row's newline. Cell j of row r goes to block[j * capacity + r] (column-major).
 */
function readPlainRows(
  bytes: Uint8Array,
  pos: number,
  column: number,
  lastNewline: number,
  block: Float64Array,
  p: number,
  capacity: number,
  row: number,
  lineStarts: Float64Array,
): number {
  const last = p - 1;
  let rows = 0;
  let j = column;
  rowLoop: while (pos <= lastNewline) {
    let i = pos;
    if (j === 0) lineStarts[row + rows] = pos;
    for (let at = j * capacity + row + rows; j < p; j++, at += capacity) {
      pos = i;
      // The sign without a branch (half the cells of real data are negative: a branch on it is
      // mispredicted often): `minus` is 0 or 1, and the value is multiplied by 1 or -1 (exact; 0 -> -0).
      const minus = +(bytes[i] === MINUS);
      i += minus;
      let c = bytes[i];
      // `digit >>> 0 < 10` tests 0..9 in one comparison (a byte below '0' wraps to a large number).
      let digit = c - ZERO;
      let integer = 0;
      const integerStart = i;
      for (; digit >>> 0 < 10; digit = bytes[++i] - ZERO) integer = integer * 10 + digit;
      let digits = i - integerStart;
      let fraction = 0;
      if (digit === POINT - ZERO) {
        const fractionStart = ++i;
        for (digit = bytes[i] - ZERO; digit >>> 0 < 10; digit = bytes[++i] - ZERO) integer = integer * 10 + digit;
        fraction = i - fractionStart;
        digits += fraction;
      }
      c = bytes[i];
      if (digits === 0 || digits > MAX_INLINE_DIGITS) break rowLoop;
      // A subtraction, not unary minus: -0 is not a small integer, and the compiled loop would bail out on it.
      let power = 0 - fraction;
      if (c === LOWER_E || c === UPPER_E) {
        c = bytes[++i];
        const negativePower = c === MINUS;
        if (negativePower || c === PLUS) c = bytes[++i];
        let exponent = 0;
        let exponentDigits = 0;
        for (; c >= ZERO && c <= NINE; c = bytes[++i], exponentDigits++) exponent = exponent * 10 + (c - ZERO);
        if (exponentDigits === 0 || exponentDigits > MAX_EXPONENT_DIGITS) break rowLoop;
        power = negativePower ? power - exponent : power + exponent;
        if (power > MAX_EXACT_POWER || power < -MAX_EXACT_POWER) break rowLoop;
      }
      if (j === last) {
        if (c === CR) c = bytes[++i];
        if (c !== NEWLINE) break rowLoop;
      } else if (c !== COMMA) break rowLoop;
      const magnitude = power < 0 ? integer / POW10[0 - power] : integer * POW10[power];
      block[at] = magnitude * (1 - 2 * minus);
      i++;
    }
    rows++;
    j = 0;
    pos = i;
  }
  // `pos` is the start of the cell that stopped the loop, or of the first row past `lastNewline`.
  plainEnd = pos;
  plainColumn = j;
  return rows;
}

/**
 * The plain loop alone, for the exactness test (tests/engine/cli/csv-exact.test.ts): reads `rows`
 * newline-ended rows of `p` cells from the start of `bytes`. Returns how many rows it took (the rest
 * would go to the careful path) and their cells, column-major.
 */
export function readPlainRowsForTest(bytes: Uint8Array, p: number, rows: number): { rows: number; values: Float64Array } {
  const values = new Float64Array(rows * p);
  const taken = readPlainRows(bytes, 0, 0, bytes.lastIndexOf(NEWLINE), values, p, rows, 0, new Float64Array(rows));
  return { rows: taken, values };
}

/**
 * Reads the rows of a quote-free CSV (the caller has checked there is no `"` and read the header),
 * starting at byte `bodyStart`. Same line numbers, blank-line skipping and messages as the general
 * reader; text columns are re-read as strings and built by `toTextColumn`. The plain loop reads what
 * it can; each cell it stops at (and each blank line) is read here through the shared scanner and
 * the general reader's rule, and the plain loop goes on from the next cell.
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
  const last = p - 1;
  const capacity = countLines(bytes, bodyStart);
  // One allocation for all columns (thousands of small ones cost more than the reading on a wide file).
  const block = new Float64Array(capacity * p);
  const textual = new Uint8Array(p);
  const lineStarts = new Float64Array(capacity);
  const lastNewline = bytes.lastIndexOf(NEWLINE);
  let nRows = 0;
  let blankLines = 0;
  let pos = bodyStart;
  let j = 0;
  for (;;) {
    nRows += readPlainRows(bytes, pos, j, lastNewline, block, p, capacity, nRows, lineStarts);
    pos = plainEnd;
    j = plainColumn;
    if (j === 0) {
      if (pos >= bytes.length) break;
      if (isBlankLine(bytes, pos)) {
        blankLines++;
        pos = lineEnd(bytes, pos) + 1;
        continue;
      }
      lineStarts[nRows] = pos;
    }
    // One careful cell: cell j of row nRows.
    let v = scanSimpleDecimal(bytes, pos);
    const cellEnd = scanned.end;
    const atLineEnd = cellEnd >= bytes.length || bytes[cellEnd] === NEWLINE;
    if (atLineEnd !== (j === last)) {
      const start = lineStarts[nRows];
      const fields = decoder.decode(bytes.subarray(start, lineEnd(bytes, start))).split(',').length;
      const line = nRows + blankLines + 2; // the header is line 1
      throw new EngineInputError(`${file}: line ${line} has ${fields} fields but the header has ${p}`, 'data');
    }
    if (!textual[j] && Number.isNaN(v)) {
      const rule = classify(decoder.decode(bytes.subarray(pos, cellEnd)));
      if (rule === undefined) textual[j] = 1;
      else v = rule;
    }
    block[j * capacity + nRows] = v;
    pos = cellEnd + 1;
    if (j === last) {
      nRows++;
      j = 0;
    } else j++;
  }
  if (nRows === 0) throw new EngineInputError(`${file}: the file has a header but no data rows`, 'data');
  return {
    nRows,
    columns: header.map((name, k): EngineColumn => {
      const values = block.subarray(k * capacity, k * capacity + capacity);
      // Blank lines were counted in the capacity: only then is a column cut to its rows.
      if (!textual[k]) return { name, kind: 'numeric', values: nRows === capacity ? values : values.slice(0, nRows) };
      // A text column: read its cells again as strings (rare in large files, so done only then).
      const cells = Array.from(lineStarts.subarray(0, nRows), (start) => decoder.decode(bytes.subarray(start, lineEnd(bytes, start))).split(',')[k]);
      return toTextColumn(name, cells);
    }),
  };
}

/**
 * Runs the plain loop at load on rows that take each of its branches (minus, point, exponents with
 * either sign, -0, CR LF, a trailing point), so the loop is compiled with type feedback for all of
 * them. Without this, the first exponent met in a large file (e.g. row 291 of the bench's
 * 20000 x 200 file) made the compiled loop bail out and be compiled again while running slowly
 * meanwhile: measured 10-15 % of a first read (V8 in Node 20). Enough rows (12,800 cells, about a
 * millisecond) that V8 also starts optimizing the loop now, on a background thread, while the CLI
 * goes on to open and read the file: the first read of the bench's 4.4 MB file took 24-30 ms with
 * 60 cells here (the loop compiled mid-read) and 18 ms with these.
 */
function warmUp(): void {
  const rows = 400;
  const sample = Buffer.from('-1.5e-3,2E+4,-0,7\r\n1.25,3e2,.5,-8.\n'.repeat(rows / 2));
  for (let k = 0; k < 8; k++) readPlainRows(sample, 0, 0, sample.length - 1, new Float64Array(4 * rows), 4, rows, 0, new Float64Array(rows));
}
warmUp();
