/**
 * What the folds of one cross-validation share besides the design: the cross products of all rows
 * (gaussian Gram form: each fold's Gram is S(all) - S(held out), PathOptions.crossProducts), and
 * where values were imputed, so each fold can impute them again from its training rows only.
 */
import { crossProducts, FULL_GRAM_COLUMNS, subtractCrossProducts, usesGram } from '../index';
import type { BuiltDesign, CrossProducts, DesignMatrix, EngineTable, PathOptions } from '../index';

/** A predictor with imputed cells: its design column(s) and the design rows whose value was missing. */
export interface ImputedPredictor {
  kind: 'numeric' | 'categorical';
  terms: number[];
  rows: Int32Array;
}

export interface FoldShared {
  imputed: ImputedPredictor[];
  /** Cross products of all rows of the design (absent when not in the Gram form, or with imputation). */
  crossProducts?: CrossProducts;
}

/** The imputed cells of a built design, found from the table's missing values. */
export function imputedPredictors(table: EngineTable, built: BuiltDesign): ImputedPredictor[] {
  const out: ImputedPredictor[] = [];
  for (const enc of built.encoding.columns) {
    const imputed = enc.kind === 'numeric' ? enc.imputeValue !== undefined : enc.imputeLevel !== undefined;
    if (!imputed) continue;
    const column = table.columns.find((c) => c.name === enc.column);
    if (!column) continue;
    const rows: number[] = [];
    built.rows.forEach((row, i) => {
      if (column.kind === 'numeric' ? Number.isNaN(column.values[row]) : column.codes[row] < 0) rows.push(i);
    });
    // A stored fill value for a column without gaps in these rows (kept for scoring new tables).
    if (rows.length === 0) continue;
    out.push({ kind: enc.kind, terms: enc.kind === 'numeric' ? [enc.term] : enc.terms, rows: Int32Array.from(rows) });
  }
  return out;
}

/**
 * Cross products of all rows when every fold's training rows will use the Gram form with the full G
 * (the same rule as prepareProblem, on the smallest training set): `all` when the full path has
 * them already. With imputation each fold's design differs from the full one, so there are none.
 */
export function foldShared(
  table: EngineTable,
  built: BuiltDesign,
  options: PathOptions,
  foldIds: Int32Array,
  folds: number,
  all?: CrossProducts,
): FoldShared {
  const imputed = imputedPredictors(table, built);
  const { n, p } = built.design;
  let largestFold = 0;
  const counts = new Int32Array(folds);
  for (const f of foldIds) largestFold = Math.max(largestFold, ++counts[f]);
  const gram = imputed.length === 0 && p <= FULL_GRAM_COLUMNS && usesGram(options, n - largestFold, p);
  return gram ? { imputed, crossProducts: all ?? crossProducts(built.design, undefined, undefined, built.y) } : { imputed };
}

/** The fold's cross products: S(all) - S(held-out rows). */
export function foldCrossProducts(design: DesignMatrix, shared: FoldShared, test: number[], y?: Float64Array): CrossProducts | undefined {
  if (!shared.crossProducts) return undefined;
  const all = shared.crossProducts;
  return subtractCrossProducts(all, crossProducts(design, test, all.center, all.response ? y : undefined, all.response?.center));
}

/**
 * The design with every imputed cell refilled from the fold's training rows: the mean of the
 * predictor's observed training values, or (categorical) the indicators of its most frequent
 * training level (first level on ties, as buildDesign). Held-out rows get the same values, so
 * nothing about them leaks into the fit or its scoring.
 */
export function imputeFromTraining(design: DesignMatrix, imputed: ImputedPredictor[], isTraining: Uint8Array): DesignMatrix {
  if (imputed.length === 0) return design;
  const { n } = design;
  const x = Float64Array.from(design.x);
  for (const predictor of imputed) {
    const missing = new Uint8Array(n);
    for (const i of predictor.rows) missing[i] = 1;
    if (predictor.kind === 'numeric') {
      const off = predictor.terms[0] * n;
      let sum = 0;
      let count = 0;
      for (let i = 0; i < n; i++) {
        if (!isTraining[i] || missing[i]) continue;
        sum += x[off + i];
        count++;
      }
      // No observed training value: keep the full-data value (the fold has nothing better).
      if (count === 0) continue;
      for (const i of predictor.rows) x[off + i] = sum / count;
      continue;
    }
    const counts = predictor.terms.map((term) => {
      let c = 0;
      for (let i = 0; i < n; i++) if (isTraining[i] && !missing[i] && x[term * n + i] === 1) c++;
      return c;
    });
    let mode = -1;
    counts.forEach((c, t) => {
      if (c > 0 && (mode < 0 || c > counts[mode])) mode = t;
    });
    if (mode < 0) continue;
    for (const i of predictor.rows) predictor.terms.forEach((term, t) => (x[term * n + i] = t === mode ? 1 : 0));
  }
  return { ...design, x };
}
