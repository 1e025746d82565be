import {
  EngineInputError,
  type DesignEncoding,
  type DesignMatrix,
  type EngineColumn,
  type EngineTable,
  type FitSpec,
  type TermEncoding,
} from '../types';
import { encodeResponse } from './response';

export interface BuiltDesign {
  design: DesignMatrix;
  y: Float64Array;
  /** Table row indices kept (rows with a missing response, or with 'drop' a missing predictor, go). */
  rows: Int32Array;
  /** Per design column: the index in spec.predictors of its categorical predictor, or -1. */
  groupsOfTerms: number[];
  notes: string[];
  encoding: DesignEncoding;
}

type DesignSpec = Pick<FitSpec, 'response' | 'predictors' | 'missing' | 'family'>;

export function findColumn(table: EngineTable, name: string, field: string): EngineColumn {
  const column = table.columns.find((c) => c.name === name);
  if (!column) throw new EngineInputError(`unknown column "${name}" (${field})`, field);
  return column;
}

function isMissing(column: EngineColumn, row: number): boolean {
  return column.kind === 'numeric' ? Number.isNaN(column.values[row]) : column.codes[row] < 0;
}

/** Sets gap[row] for the candidate rows where the column is missing; `everyRow`: the candidates are 0, 1, ... */
function markMissing(column: EngineColumn, candidate: Int32Array, everyRow: boolean, gap: Uint8Array): void {
  const m = candidate.length;
  if (column.kind === 'numeric') {
    const values = column.values;
    if (everyRow) {
      // Straight through (no gather): the usual case of a whole table.
      for (let row = 0; row < m; row++) if (Number.isNaN(values[row])) gap[row] = 1;
      return;
    }
    for (let i = 0; i < m; i++) {
      const row = candidate[i];
      if (Number.isNaN(values[row])) gap[row] = 1;
    }
  } else {
    const codes = column.codes;
    for (let i = 0; i < m; i++) {
      const row = candidate[i];
      if (codes[row] < 0) gap[row] = 1;
    }
  }
}

/**
 * The candidate rows kept: not missing the response and, with missing = 'drop', no predictor
 * missing. Predictors are checked column by column into a row mask (one pass per column, in memory
 * order) rather than row by row across the columns.
 */
function keepRows(
  table: EngineTable,
  candidate: Int32Array,
  everyRow: boolean,
  response: EngineColumn,
  predictors: EngineColumn[],
  spec: DesignSpec,
  notes: string[],
): Int32Array {
  const gap = new Uint8Array(spec.missing === 'drop' ? table.nRows : 0);
  if (spec.missing === 'drop') for (const column of predictors) markMissing(column, candidate, everyRow, gap);
  const kept = new Int32Array(candidate.length);
  let n = 0;
  let missingResponse = 0;
  let missingPredictor = 0;
  for (const row of candidate) {
    if (isMissing(response, row)) missingResponse++;
    else if (spec.missing === 'drop' && gap[row] === 1) missingPredictor++;
    else kept[n++] = row;
  }
  if (missingResponse > 0) notes.push(`${missingResponse} rows with a missing response were dropped`);
  if (missingPredictor > 0) notes.push(`${missingPredictor} rows with a missing predictor were dropped`);
  return n === kept.length ? kept : kept.slice(0, n);
}

/**
 * Encodes predictors into a dense column-major design: a numeric predictor is one column, a
 * categorical one gets one indicator per level, named `column=level` (all levels: with a penalty
 * there is no need for a reference level). Rows with a missing response are dropped; rows with a
 * missing predictor are dropped, or (missing = 'impute') filled with the column's mean or mode over
 * the kept rows. Columns constant over the kept rows are reported in `notes` and left out.
 *
 * Each column is written once, straight into the design at its place (a constant one is then
 * overwritten by the next), with its range found in the same pass; a numeric column with nothing to
 * fill is copied as a block. Sums and ranges run over the same values in the same order as a
 * column-by-column build, so the design is the same to the bit (tests/engine/core/design-build.test.ts).
 * `sharedMemory`: the design's values in a SharedArrayBuffer, for a caller that will hand them to
 * worker threads (the same numbers).
 */
export function buildDesign(table: EngineTable, spec: DesignSpec, rows?: Int32Array, sharedMemory = false): BuiltDesign {
  const notes: string[] = [];
  const responseColumn = findColumn(table, spec.response, 'response');
  // By name through a map: findColumn per predictor is quadratic in the columns (5000 on wide files).
  const byName = new Map<string, EngineColumn>();
  for (const c of table.columns) if (!byName.has(c.name)) byName.set(c.name, c); // the first, as findColumn
  const predictors = spec.predictors.map((name) => byName.get(name) ?? findColumn(table, name, 'predictors'));
  const candidate = rows ?? allRows(table.nRows);
  const keptRows = keepRows(table, candidate, rows === undefined, responseColumn, predictors, spec, notes);
  const n = keptRows.length;
  if (n === 0) throw new EngineInputError('no rows remain after removing missing values', 'data');
  // Every row of the table, in order: columns are read directly instead of through `keptRows`.
  const allKept = n === table.nRows && (rows === undefined || keptRows.every((row, i) => row === i));

  const { y, responseLevels, note } = encodeResponse(responseColumn, keptRows, spec.family);
  if (note) notes.push(note);

  const width = predictors.reduce((sum, c) => sum + (c.kind === 'numeric' ? 1 : c.levels.length), 0);
  // In shared memory when threads will read it (the caller says so): no copy to share it later.
  const x = sharedMemory ? new Float64Array(new SharedArrayBuffer(n * width * 8)) : new Float64Array(n * width);
  const terms: string[] = [];
  const groupsOfTerms: number[] = [];
  const encoding: TermEncoding[] = [];
  const constant: { term: string; value: number }[] = [];
  /** The column just written at the next free place becomes a term, unless constant (min === max). */
  const addColumn = (min: number, max: number, term: string, group: number): number => {
    if (min === max) {
      constant.push({ term, value: min });
      return -1;
    }
    terms.push(term);
    groupsOfTerms.push(group);
    return terms.length - 1;
  };

  predictors.forEach((column, index) => {
    if (column.kind === 'numeric') {
      const at = terms.length * n;
      const { sum, count, min, max } = writeNumeric(column.values, keptRows, allKept, x, at);
      if (count === 0) throw new EngineInputError(`column "${column.name}" has no values in the rows used`, column.name);
      // Every design value is finite (fitPathPrepared relies on it and does not scan the rows again):
      // an infinite cell, or a fill value that overflowed, shows in the range of what was written.
      if (!(Number.isFinite(min) && Number.isFinite(max))) {
        let i = 0;
        while (i < n - 1 && Number.isFinite(x[at + i])) i++;
        throw new EngineInputError(`column "${column.name}" has a non-finite value ${x[at + i]} in row ${keptRows[i] + 1}`, column.name);
      }
      const mean = sum / count;
      const imputed = n - count;
      if (imputed > 0) notes.push(`column "${column.name}": ${imputed} missing value${imputed === 1 ? '' : 's'} set to the mean ${Number(mean.toPrecision(6))}`);
      const term = addColumn(min, max, column.name, -1);
      // Under 'impute' every predictor keeps its fill value, not only those with gaps in training:
      // a blank cell in a table scored later is filled the same way.
      const fill = spec.missing === 'impute' || imputed > 0;
      if (term >= 0) encoding.push({ column: column.name, kind: 'numeric', term, ...(fill ? { imputeValue: mean } : {}) });
      return;
    }
    const counts = new Int32Array(column.levels.length);
    for (let i = 0; i < n; i++) {
      const code = column.codes[keptRows[i]];
      if (code >= 0) counts[code]++;
    }
    let mode = -1;
    for (let k = 0; k < counts.length; k++) if (mode < 0 || counts[k] > counts[mode]) mode = k;
    if (mode < 0 || counts[mode] === 0) throw new EngineInputError(`column "${column.name}" has no values in the rows used`, column.name);
    let imputed = 0;
    const codes = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const code = column.codes[keptRows[i]];
      if (code < 0) imputed++;
      codes[i] = code < 0 ? mode : code;
    }
    if (imputed > 0) notes.push(`column "${column.name}": ${imputed} missing value${imputed === 1 ? '' : 's'} set to the most frequent level "${column.levels[mode]}"`);
    const levels: string[] = [];
    const levelTerms: number[] = [];
    column.levels.forEach((level, k) => {
      const start = terms.length * n;
      let min = Infinity;
      let max = -Infinity;
      for (let i = 0; i < n; i++) {
        const v = codes[i] === k ? 1 : 0;
        x[start + i] = v;
        if (v < min) min = v;
        if (v > max) max = v;
      }
      const term = addColumn(min, max, `${column.name}=${level}`, index);
      if (term >= 0) {
        levels.push(level);
        levelTerms.push(term);
      }
    });
    if (levelTerms.length > 0) {
      const fill = spec.missing === 'impute' || imputed > 0;
      encoding.push({ column: column.name, kind: 'categorical', levels, terms: levelTerms, ...(fill ? { imputeLevel: column.levels[mode] } : {}) });
    }
  });

  notes.push(...constantNotes(constant));

  const p = terms.length;
  return {
    // Constant columns left room at the end: cut it off (a copy, only then).
    design: { n, p, x: p < width ? x.slice(0, n * p) : x, terms },
    y,
    rows: keptRows,
    groupsOfTerms,
    notes,
    encoding: responseLevels ? { columns: encoding, responseLevels } : { columns: encoding },
  };
}

/**
 * Writes one numeric predictor over the kept rows into x from `at`, a missing cell as the mean of the
 * others; returns the sum and count of the present cells and the range of the column as written.
 * One pass finds sum, count and range; a column with missing cells is written in a second pass (the
 * mean is known only then) and its range found again over the written values, in row order.
 */
function writeNumeric(
  source: Float64Array,
  keptRows: Int32Array,
  allKept: boolean,
  x: Float64Array,
  at: number,
): { sum: number; count: number; min: number; max: number } {
  const n = keptRows.length;
  let sum = 0;
  let count = 0;
  let min = Infinity;
  let max = -Infinity;
  // Two copies of one loop, so the common whole-column case reads the column without an index array.
  if (allKept) {
    for (let i = 0; i < n; i++) {
      const v = source[i];
      if (!Number.isNaN(v)) {
        sum += v;
        count++;
        if (v < min) min = v;
        if (v > max) max = v;
      }
    }
  } else {
    for (let i = 0; i < n; i++) {
      const v = source[keptRows[i]];
      if (!Number.isNaN(v)) {
        sum += v;
        count++;
        if (v < min) min = v;
        if (v > max) max = v;
      }
    }
  }
  if (count === n) {
    if (allKept) x.set(source.subarray(0, n), at);
    else for (let i = 0; i < n; i++) x[at + i] = source[keptRows[i]];
  } else if (count > 0) {
    const mean = sum / count;
    min = Infinity;
    max = -Infinity;
    for (let i = 0; i < n; i++) {
      const v = source[keptRows[i]];
      const filled = Number.isNaN(v) ? mean : v;
      x[at + i] = filled;
      if (filled < min) min = filled;
      if (filled > max) max = filled;
    }
  }
  return { sum, count, min, max };
}

function allRows(count: number): Int32Array {
  const rows = new Int32Array(count);
  for (let i = 0; i < count; i++) rows[i] = i;
  return rows;
}

/** The sub-design of some of a design's rows (e.g. one fold's training rows), with their responses. */
export function selectRows(design: DesignMatrix, y: Float64Array, rows: ArrayLike<number>): { design: DesignMatrix; y: Float64Array } {
  const n = rows.length;
  const x = new Float64Array(n * design.p);
  const ySub = new Float64Array(n);
  for (let i = 0; i < n; i++) ySub[i] = y[rows[i]];
  for (let j = 0; j < design.p; j++) {
    const from = j * design.n;
    const to = j * n;
    for (let i = 0; i < n; i++) x[to + i] = design.x[from + rows[i]];
  }
  return { design: { n, p: design.p, x, terms: design.terms }, y: ySub };
}

/** One note per constant column while they are few; past that one note, so a wide table stays readable. */
function constantNotes(constant: { term: string; value: number }[]): string[] {
  const SHOWN = 5;
  if (constant.length <= SHOWN) {
    return constant.map(({ term, value }) => `column "${term}" is constant (${value}) over the rows used and was left out`);
  }
  const named = constant.slice(0, SHOWN).map(({ term }) => `"${term}"`).join(', ');
  return [`${constant.length} columns are constant over the rows used and were left out: ${named} and ${constant.length - SHOWN} more`];
}
