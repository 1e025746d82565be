/**
 * A fast reader for the common case of a CSV without quotes: large numeric tables (e.g. 20000 x 200)
 * take seconds through a general parser that builds a string per cell. Here the bytes are scanned
 * once; simple decimals are converted by Clinger's exact fast path (W. D. Clinger, "How to read
 * floating point numbers accurately", PLDI 1990: a mantissa below 2^53 times or divided by an exact
 * power of ten up to 1e22 is correctly rounded in one operation); any other cell goes through the
 * general reader's rule, so both readers give identical tables (tests/engine/cli/csv.test.ts).
 */
import { scanCell, scanned } from './csv-scan';
import { EngineInputError, type EngineColumn, type EngineTable } from '../engine/types';

const COMMA = 44;
const NEWLINE = 10;
const SPACE = 32;
const TAB = 9;
const CR = 13;

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
      const cellEnd = scanned.end;
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
