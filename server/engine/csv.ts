/**
 * CSV text -> EngineTable, for the command-line interface and benchmarks. A header row names the
 * columns. A column is numeric when every non-missing cell parses as a finite decimal number,
 * otherwise categorical (levels in sorted order). Missing markers: empty, NA, N/A, NaN, null, ?
 * (case-insensitive, surrounding blanks ignored). Errors name the file, the line and the column.
 */
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { EngineInputError, type EngineColumn, type EngineTable } from './types';

const MISSING = new Set(['', 'na', 'n/a', 'nan', 'null', '?']);
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export function isMissingCell(cell: string): boolean {
  return MISSING.has(cell.trim().toLowerCase());
}

function toColumn(name: string, cells: string[]): EngineColumn {
  const values = new Float64Array(cells.length);
  let numeric = true;
  for (let i = 0; i < cells.length && numeric; i++) {
    const cell = cells[i].trim();
    if (isMissingCell(cell)) values[i] = Number.NaN;
    else if (DECIMAL.test(cell) && Number.isFinite(Number(cell))) values[i] = Number(cell);
    else numeric = false;
  }
  if (numeric) return { name, kind: 'numeric', values };
  const present = cells.map((c) => c.trim()).filter((c) => !isMissingCell(c));
  const levels = [...new Set(present)].sort();
  const code = new Map(levels.map((level, k) => [level, k]));
  const codes = new Int32Array(cells.length);
  cells.forEach((c, i) => {
    codes[i] = isMissingCell(c) ? -1 : (code.get(c.trim()) as number);
  });
  return { name, kind: 'categorical', codes, levels };
}

/** `file` names the source in error messages. Line numbers count the header as line 1. */
export function parseCsvText(text: string, file: string): EngineTable {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
  const bad = parsed.errors.find((e) => e.type !== 'Delimiter');
  if (bad) {
    const line = bad.row === undefined ? '' : ` at line ${bad.row + 1}`;
    throw new EngineInputError(`${file}: cannot read CSV${line}: ${bad.message}`, 'data');
  }
  const rows = parsed.data;
  while (rows.length > 0 && rows[rows.length - 1].every((c) => c.trim() === '')) rows.pop();
  if (rows.length === 0) throw new EngineInputError(`${file}: the file is empty`, 'data');
  const header = rows[0].map((h) => h.trim());
  header.forEach((name, j) => {
    if (name === '') throw new EngineInputError(`${file}: column ${j + 1} has an empty name in the header`, 'data');
    const first = header.indexOf(name);
    if (first !== j) {
      throw new EngineInputError(`${file}: column name "${name}" appears twice in the header (columns ${first + 1} and ${j + 1})`, 'data');
    }
  });
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
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    throw new EngineInputError(`cannot read data file ${path}: ${(error as Error).message}`, 'data');
  }
  return parseCsvText(text, path);
}
