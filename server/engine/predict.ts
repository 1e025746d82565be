/**
 * Prediction for new rows from a stored fit: the stored encoding turns the raw columns into design
 * columns (numeric as is, categorical as level indicators, stored imputation values for missing
 * cells), and the original-scale coefficients then apply directly, so no standardization step is
 * needed: eta = b0 + x'b. Binomial: the class-1 probability 1 / (1 + exp(-eta)).
 */
import {
  EngineInputError,
  type DesignEncoding,
  type EngineColumn,
  type EngineTable,
  type Family,
  type PathResult,
} from './types';

/** What prediction needs from a stored fit at one lambda. */
export interface StoredModel {
  family: Family;
  encoding: DesignEncoding;
  /** Original scale; coefficients[j] multiplies design column j. */
  intercept: number;
  coefficients: ArrayLike<number>;
}

export interface Prediction {
  /** b0 + x'b for each row. */
  linearPredictor: Float64Array;
  /** Gaussian: the fitted mean (= linear predictor). Binomial: the probability of class 1. */
  response: Float64Array;
  /** Binomial with a categorical response: the level whose probability `response` gives. */
  positiveClass?: string;
}

function findColumn(table: EngineTable, name: string): EngineColumn {
  const column = table.columns.find((c) => c.name === name);
  if (!column) throw new EngineInputError(`the data have no column "${name}", which the fit uses`, name);
  return column;
}

/** Numeric values of a column the fit encoded as numeric, with the stored imputation for gaps. */
function numericValues(column: EngineColumn, nRows: number, imputeValue?: number): Float64Array {
  if (column.kind !== 'numeric') {
    throw new EngineInputError(`column "${column.name}" must be numeric, as in the fit, but holds text`, column.name);
  }
  const values = new Float64Array(nRows);
  for (let i = 0; i < nRows; i++) {
    const v = column.values[i];
    if (!Number.isNaN(v)) values[i] = v;
    else if (imputeValue !== undefined) values[i] = imputeValue;
    else throw new EngineInputError(`column "${column.name}" has a missing value in row ${i + 1}`, column.name);
  }
  return values;
}

/** The level label of each row (numbers read back as text: a numeric-looking level stays usable). */
function levelOf(column: EngineColumn, row: number): string | undefined {
  if (column.kind === 'categorical') return column.codes[row] < 0 ? undefined : column.levels[column.codes[row]];
  return Number.isNaN(column.values[row]) ? undefined : String(column.values[row]);
}

export function predictRows(table: EngineTable, model: StoredModel): Prediction {
  const n = table.nRows;
  const eta = new Float64Array(n).fill(model.intercept);
  const b = model.coefficients;
  for (const enc of model.encoding.columns) {
    const column = findColumn(table, enc.column);
    if (enc.kind === 'numeric') {
      if (b[enc.term] === 0) continue;
      const values = numericValues(column, n, enc.imputeValue);
      for (let i = 0; i < n; i++) eta[i] += b[enc.term] * values[i];
      continue;
    }
    const termOfLevel = new Map(enc.levels.map((level, k) => [level, enc.terms[k]]));
    for (let i = 0; i < n; i++) {
      const level = levelOf(column, i) ?? enc.imputeLevel;
      if (level === undefined) {
        throw new EngineInputError(`column "${enc.column}" has a missing value in row ${i + 1}`, enc.column);
      }
      const term = termOfLevel.get(level);
      if (term === undefined) {
        throw new EngineInputError(
          `column "${enc.column}" has level "${level}" in row ${i + 1}, which the fit did not see (known: ${enc.levels.join(', ')})`,
          enc.column,
        );
      }
      eta[i] += b[term];
    }
  }
  if (model.family === 'gaussian') return { linearPredictor: eta, response: eta.slice() };
  const probability = eta.map((e) => 1 / (1 + Math.exp(-e)));
  const positiveClass = model.encoding.responseLevels?.[1];
  return { linearPredictor: eta, response: probability, ...(positiveClass ? { positiveClass } : {}) };
}

/** Prediction from a path fitted by fitPath (which records the encoding) at lambda index `index`. */
export function predictPath(table: EngineTable, path: PathResult, index: number): Prediction {
  if (!path.encoding) throw new Error('this path has no stored encoding; fit it with fitPath');
  if (!Number.isInteger(index) || index < 0 || index >= path.lambda.length) {
    throw new EngineInputError(`lambda index ${index} is outside 0..${path.lambda.length - 1}`, 'lambda');
  }
  return predictRows(table, {
    family: path.family,
    encoding: path.encoding,
    intercept: path.intercept[index],
    coefficients: path.coefficients[index],
  });
}
