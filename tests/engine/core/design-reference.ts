/**
 * The design build as it was before it wrote columns straight into the design (commit 3564879,
 * server/engine/design/build.ts): a plain column-by-column version kept as the reference that the
 * faster build must match to the bit (design-build.test.ts). Not used by the application.
 */
import {
  EngineInputError,
  type DesignEncoding,
  type EngineColumn,
  type EngineTable,
  type FitSpec,
  type TermEncoding,
} from '../../../server/engine/types';
import { encodeResponse } from '../../../server/engine/design/response';

interface BuiltDesign {
  design: { n: number; p: number; x: Float64Array; terms: string[] };
  y: Float64Array;
  /** Table row indices kept (rows with a missing response, or with 'drop' a missing predictor, go). */
  rows: Int32Array;
  /** Per design column: the index in spec.predictors of its categorical predictor, or -1. */
  groupsOfTerms: number[];
  notes: string[];
  encoding: DesignEncoding;
}

type DesignSpec = Pick<FitSpec, 'response' | 'predictors' | 'missing' | 'family'>;

function findColumn(table: EngineTable, name: string, field: string): EngineColumn {
  const column = table.columns.find((c) => c.name === name);
  if (!column) throw new EngineInputError(`unknown column "${name}" (${field})`, field);
  return column;
}

function isMissing(column: EngineColumn, row: number): boolean {
  return column.kind === 'numeric' ? Number.isNaN(column.values[row]) : column.codes[row] < 0;
}

/**
 * Encodes predictors into a dense column-major design: a numeric predictor is one column, a
 * categorical one gets one indicator per level, named `column=level` (all levels: with a penalty
 * there is no need for a reference level). Rows with a missing response are dropped; rows with a
 * missing predictor are dropped, or (missing = 'impute') filled with the column's mean or mode over
 * the kept rows. Columns constant over the kept rows are reported in `notes` and left out.
 */
export function referenceBuildDesign(table: EngineTable, spec: DesignSpec, rows?: Int32Array): BuiltDesign {
  const notes: string[] = [];
  const responseColumn = findColumn(table, spec.response, 'response');
  const predictors = spec.predictors.map((name) => findColumn(table, name, 'predictors'));
  const candidate = rows ?? Int32Array.from({ length: table.nRows }, (_, i) => i);

  const kept: number[] = [];
  let missingResponse = 0;
  let missingPredictor = 0;
  for (const row of candidate) {
    if (isMissing(responseColumn, row)) missingResponse++;
    else if (spec.missing === 'drop' && predictors.some((c) => isMissing(c, row))) missingPredictor++;
    else kept.push(row);
  }
  if (missingResponse > 0) notes.push(`${missingResponse} rows with a missing response were dropped`);
  if (missingPredictor > 0) notes.push(`${missingPredictor} rows with a missing predictor were dropped`);
  const keptRows = Int32Array.from(kept);
  const n = keptRows.length;
  if (n === 0) throw new EngineInputError('no rows remain after removing missing values', 'data');

  const { y, responseLevels, note } = encodeResponse(responseColumn, keptRows, spec.family);
  if (note) notes.push(note);

  const columns: Float64Array[] = [];
  const terms: string[] = [];
  const groupsOfTerms: number[] = [];
  const encoding: TermEncoding[] = [];
  const constant: { term: string; value: number }[] = [];
  const addColumn = (values: Float64Array, term: string, group: number): number => {
    let min = Infinity;
    let max = -Infinity;
    for (let i = 0; i < n; i++) {
      if (values[i] < min) min = values[i];
      if (values[i] > max) max = values[i];
    }
    if (min === max) {
      constant.push({ term, value: min });
      return -1;
    }
    columns.push(values);
    terms.push(term);
    groupsOfTerms.push(group);
    return terms.length - 1;
  };

  predictors.forEach((column, index) => {
    if (column.kind === 'numeric') {
      const values = new Float64Array(n);
      let sum = 0;
      let count = 0;
      for (let i = 0; i < n; i++) {
        const v = column.values[keptRows[i]];
        if (!Number.isNaN(v)) {
          sum += v;
          count++;
        }
      }
      const mean = count > 0 ? sum / count : NaN;
      let imputed = 0;
      for (let i = 0; i < n; i++) {
        const v = column.values[keptRows[i]];
        if (Number.isNaN(v)) imputed++;
        values[i] = Number.isNaN(v) ? mean : v;
      }
      if (count === 0) throw new EngineInputError(`column "${column.name}" has no values in the rows used`, column.name);
      if (imputed > 0) notes.push(`column "${column.name}": ${imputed} missing value${imputed === 1 ? '' : 's'} set to the mean ${Number(mean.toPrecision(6))}`);
      const term = addColumn(values, column.name, -1);
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
      const values = new Float64Array(n);
      for (let i = 0; i < n; i++) values[i] = codes[i] === k ? 1 : 0;
      const term = addColumn(values, `${column.name}=${level}`, index);
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

  const p = columns.length;
  const x = new Float64Array(n * p);
  columns.forEach((values, j) => x.set(values, j * n));
  return {
    design: { n, p, x, terms },
    y,
    rows: keptRows,
    groupsOfTerms,
    notes,
    encoding: responseLevels ? { columns: encoding, responseLevels } : { columns: encoding },
  };
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
