/**
 * Applying a stored fit to a table row by row: the linear predictor b0 + x'b (and the class-1
 * probability for binomial), or a plain error for the row (a blank cell with no stored fill, an
 * unseen category, text where the fit had numbers). A column the fit needs that is absent from the
 * table is an error for the whole table (EngineInputError naming it).
 */
import { EngineInputError, type DesignEncoding, type EngineColumn, type EngineTable, type Family } from '../../engine/index';

export interface RowPredictions {
  linearPredictor: Float64Array;
  /** Binomial: probability of class 1; gaussian: null. */
  probability: Float64Array | null;
  /** Per row: null, or what is wrong with it. */
  errors: (string | null)[];
}

function cellText(column: EngineColumn, row: number): string | undefined {
  if (column.kind === 'categorical') return column.codes[row] < 0 ? undefined : column.levels[column.codes[row]];
  return Number.isNaN(column.values[row]) ? undefined : String(column.values[row]);
}

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export function predictRowsWithErrors(
  table: EngineTable,
  model: { family: Family; encoding: DesignEncoding; intercept: number; coefficients: ArrayLike<number> },
): RowPredictions {
  const n = table.nRows;
  const eta = new Float64Array(n).fill(model.intercept);
  const errors: (string | null)[] = new Array<string | null>(n).fill(null);
  const fail = (i: number, message: string) => {
    if (errors[i] === null) errors[i] = message;
  };
  const b = model.coefficients;
  for (const enc of model.encoding.columns) {
    const column = table.columns.find((c) => c.name === enc.column);
    if (!column) throw new EngineInputError(`the table has no column "${enc.column}", which the fit uses`, enc.column);
    if (enc.kind === 'numeric') {
      const coef = b[enc.term];
      for (let i = 0; i < n; i++) {
        let v: number;
        if (column.kind === 'numeric') v = column.values[i];
        else {
          const text = cellText(column, i);
          if (text === undefined) v = Number.NaN;
          else if (DECIMAL.test(text.trim())) v = Number(text.trim());
          else {
            fail(i, `column "${enc.column}": "${text}" is not a number`);
            continue;
          }
        }
        if (Number.isNaN(v)) {
          if (enc.imputeValue === undefined) {
            fail(i, `column "${enc.column}" is blank (this fit left out rows with blanks, so it has no fill value)`);
            continue;
          }
          v = enc.imputeValue;
        }
        eta[i] += coef * v;
      }
      continue;
    }
    const termOfLevel = new Map(enc.levels.map((level, k) => [level, enc.terms[k]]));
    for (let i = 0; i < n; i++) {
      const level = cellText(column, i) ?? enc.imputeLevel;
      if (level === undefined) {
        fail(i, `column "${enc.column}" is blank (this fit left out rows with blanks, so it has no fill value)`);
        continue;
      }
      const term = termOfLevel.get(level);
      if (term === undefined) {
        // Every level seen when fitting has its own indicator (no reference level), so this one is new.
        fail(i, `column "${enc.column}": category "${level}" was not seen when fitting`);
        continue;
      }
      eta[i] += b[term];
    }
  }
  let probability: Float64Array | null = null;
  if (model.family === 'binomial') {
    probability = new Float64Array(n);
    for (let i = 0; i < n; i++) probability[i] = 1 / (1 + Math.exp(-eta[i]));
  }
  for (let i = 0; i < n; i++) {
    if (errors[i] !== null) {
      eta[i] = Number.NaN;
      if (probability) probability[i] = Number.NaN;
    }
  }
  return { linearPredictor: eta, probability, errors };
}
