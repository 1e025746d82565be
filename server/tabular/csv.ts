/**
 * CSV text -> EngineTable, for the command-line interface and benchmarks. A header row names the
 * columns. A column is numeric when every non-missing cell parses as a finite decimal number,
 * otherwise categorical (levels in sorted order). Missing markers: empty, NA, N/A, NaN, null, ?
 * (case-insensitive, surrounding blanks ignored). Errors name the file, the line and the column.
 */
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { parseQuoteFreeRows } from './csv-fast';
import { EngineInputError, type EngineColumn, type EngineTable } from '../engine/types';

const MISSING = new Set(['', 'na', 'n/a', 'nan', 'null', '?']);
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export function isMissingCell(cell: string): boolean {
  return MISSING.has(cell.trim().toLowerCase());
}

/** One cell: NaN when missing, its value when a finite decimal, undefined when text. */
export function classifyCell(raw: string): number | undefined {
  const cell = raw.trim();
  if (isMissingCell(cell)) return Number.NaN;
  if (DECIMAL.test(cell)) {
    const v = Number(cell);
    if (Number.isFinite(v)) return v;
  }
  return undefined;
}

/** A column of text cells: categorical (levels sorted), missing cells coded -1. */
export function textColumn(name: string, cells: string[]): EngineColumn {
  const present = cells.map((c) => c.trim()).filter((c) => !isMissingCell(c));
  const levels = [...new Set(present)].sort();
  const code = new Map(levels.map((level, k) => [level, k]));
  const codes = new Int32Array(cells.length);
  cells.forEach((c, i) => {
    codes[i] = isMissingCell(c) ? -1 : (code.get(c.trim()) as number);
  });
  return { name, kind: 'categorical', codes, levels };
}

function toColumn(name: string, cells: string[]): EngineColumn {
  const values = new Float64Array(cells.length);
  for (let i = 0; i < cells.length; i++) {
    const v = classifyCell(cells[i]);
    if (v === undefined) return textColumn(name, cells);
    values[i] = v;
  }
  return { name, kind: 'numeric', values };
}

function checkHeader(header: string[], file: string): void {
  // A map, not indexOf per name: quadratic in the columns was measurable on 5000-column files.
  const firstIndex = new Map<string, number>();
  header.forEach((name, j) => {
    if (name === '') throw new EngineInputError(`${file}: column ${j + 1} has an empty name in the header`, 'data');
    const first = firstIndex.get(name) ?? j;
    firstIndex.set(name, first);
    if (first !== j) {
      throw new EngineInputError(`${file}: column name "${name}" appears twice in the header (columns ${first + 1} and ${j + 1})`, 'data');
    }
  });
}

/** `file` names the source in error messages. Line numbers count the header as line 1. */
export function parseCsvText(text: string, file: string): EngineTable {
  return parseCsvBytes(Buffer.from(text, 'utf8'), file);
}

/** UTF-8 bytes (with or without a byte-order mark) -> table; quote-free files take the fast path. */
export function parseCsvBytes(input: Uint8Array, file: string): EngineTable {
  const bom = input[0] === 0xef && input[1] === 0xbb && input[2] === 0xbf;
  const bytes = bom ? input.subarray(3) : input;
  const decoder = new TextDecoder();
  if (bytes.indexOf(34) >= 0) return parseGeneralCsv(decoder.decode(bytes), file); // has a quote
  let headerEnd = bytes.indexOf(10);
  if (headerEnd < 0) headerEnd = bytes.length;
  const headerLine = decoder.decode(bytes.subarray(0, headerEnd));
  if (headerLine.trim() === '' && decoder.decode(bytes).trim() === '') {
    throw new EngineInputError(`${file}: the file is empty`, 'data');
  }
  const header = headerLine.split(',').map((h) => h.trim());
  checkHeader(header, file);
  return parseQuoteFreeRows(bytes, file, header, headerEnd + 1, classifyCell, textColumn);
}

/** Any CSV (quoted cells, embedded commas or newlines) through papaparse. */
function parseGeneralCsv(text: string, file: string): EngineTable {
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: false, delimiter: ',' });
  const bad = parsed.errors.find((e) => e.type !== 'Delimiter');
  if (bad) {
    const line = bad.row === undefined ? '' : ` at line ${bad.row + 1}`;
    throw new EngineInputError(`${file}: cannot read CSV${line}: ${bad.message}`, 'data');
  }
  const rows = parsed.data;
  while (rows.length > 0 && rows[rows.length - 1].every((c) => c.trim() === '')) rows.pop();
  if (rows.length === 0) throw new EngineInputError(`${file}: the file is empty`, 'data');
  const header = rows[0].map((h) => h.trim());
  checkHeader(header, file);
  const cells: string[][] = header.map(() => []);
  for (let r = 1; r < rows.length; r++) {
    const row = rows[r];
    if (row.length === 1 && row[0].trim() === '') continue; // a blank line
    if (row.length !== header.length) {
      throw new EngineInputError(
        `${file}: line ${r + 1} has ${row.length} fields but the header has ${header.length}`,
        'data',
      );
    }
    for (let j = 0; j < header.length; j++) cells[j].push(row[j]);
  }
  if (cells[0].length === 0) throw new EngineInputError(`${file}: the file has a header but no data rows`, 'data');
  return { nRows: cells[0].length, columns: header.map((name, j) => toColumn(name, cells[j])) };
}

export function readCsvFile(path: string): EngineTable {
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(path);
  } catch (error) {
    throw new EngineInputError(`cannot read data file ${path}: ${(error as Error).message}`, 'data');
  }
  return parseCsvBytes(bytes, path);
}
