/**
 * What the folds of one cross-validation share besides the design: the cross products of each fold's
 * rows and of all rows (gaussian Gram form: each fold's Gram is S(all) - S(its block),
 * PathOptions.crossProducts), and where values were imputed, so each fold can impute them again from
 * its training rows only. Imports the modules it needs directly (not ../index): path/fitPath.ts plans
 * the folds before the full path, so the full path's S(all) is the same sum of blocks.
 */
import { blockCrossProducts, constantOutside, rowsByBlock, subtractCrossProducts, type BlockCrossProducts, type ColumnRange, type RowsByBlock } from '../core/crossProducts';
import { constantColumns } from '../core/standardize';
import type { BuiltDesign } from '../design/build';
import { FULL_GRAM_COLUMNS, usesGram } from '../path/setup';
import type { CrossProducts, CvSpec, DesignMatrix, EngineTable, FitSpec, PathOptions } from '../types';
import { foldAssignment } from './assign';

/** A predictor with imputed cells: its design column(s) and the design rows whose value was missing. */
export interface ImputedPredictor {
  kind: 'numeric' | 'categorical';
  terms: number[];
  rows: Int32Array;
}

export interface FoldShared {
  imputed: ImputedPredictor[];
  /**
   * Cross products of all rows of the design, the sum of `blocks` (absent when not in the Gram form,
   * or with imputation).
   */
  crossProducts?: CrossProducts;
  /** blocks[k]: the cross products of fold k's rows, about the same centre. */
  blocks?: CrossProducts[];
  /** ranges[k]: the columns' minimum and maximum over fold k's rows (constant columns of a training set). */
  ranges?: ColumnRange[];
  /**
   * The design's rows and responses regrouped by fold (made with the blocks' sums): a fold's
   * held-out rows are scored there without copying them out (absent with `blocks`' absence).
   */
  byFold?: RowsByBlock;
}

/** The folds of a cross-validation on a built design: fold ids and what the folds share. */
export interface FoldPlan {
  foldIds: Int32Array;
  folds: number;
  shared: FoldShared;
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
 * Fold ids and the shared data (cross products of every fold's rows). `given`: the fold ids, and
 * the blocks when the caller computed them already (the runner spreads them over threads with
 * someBlockSums / joinBlocks: the same numbers).
 */
export function planFolds(
  table: EngineTable,
  spec: FitSpec & { cv: CvSpec },
  built: BuiltDesign,
  options: PathOptions,
  given?: { foldIds: Int32Array; folds: number; blocks?: BlockCrossProducts & { byFold?: RowsByBlock } },
  regroup = false,
): FoldPlan {
  const { foldIds, folds } = given ?? foldAssignment(table, spec, spec.cv, built);
  return { foldIds, folds, shared: foldShared(table, built, options, foldIds, folds, given?.blocks, regroup) };
}

/**
 * Whether every fold's training rows will use the Gram form with the full G (the same rule as
 * prepareProblem, on the smallest training set), so the folds share cross products. Not with
 * imputation: each fold's design then differs from the full one.
 */
export function foldsUseGram(imputed: ImputedPredictor[], built: BuiltDesign, options: PathOptions, foldIds: Int32Array, folds: number): boolean {
  const { n, p } = built.design;
  let largestFold = 0;
  const counts = new Int32Array(folds);
  for (const f of foldIds) largestFold = Math.max(largestFold, ++counts[f]);
  return imputed.length === 0 && p <= FULL_GRAM_COLUMNS && usesGram(options, n - largestFold, p);
}

/**
 * Cross products of every fold's rows and of all rows (their sum) when foldsUseGram. `regroup`:
 * also the rows regrouped by fold (RowsByBlock), which makes the block sums and every fold's scoring
 * read contiguous rows, at the cost of one more n x p array while the folds run. Callers that score
 * many folds in one process ask for it (the CLI); the studio's path job (which scores none) and its
 * fold jobs (one engine thread may hold plans of several fits) do not.
 */
export function foldShared(
  table: EngineTable,
  built: BuiltDesign,
  options: PathOptions,
  foldIds: Int32Array,
  folds: number,
  given?: BlockCrossProducts & { byFold?: RowsByBlock },
  regroup = false,
): FoldShared {
  const imputed = imputedPredictors(table, built);
  if (!foldsUseGram(imputed, built, options, foldIds, folds)) return { imputed };
  if (given) return { imputed, crossProducts: given.all, blocks: given.blocks, ranges: given.ranges, byFold: given.byFold };
  const byFold = regroup ? rowsByBlock(built.design, foldIds, folds, true, false) : undefined;
  const { blocks, all, ranges } = blockCrossProducts(built.design, foldIds, folds, built.y, byFold);
  return { imputed, crossProducts: all, blocks, ranges, byFold };
}

/** The fold's cross products: S(all) - S(its block of held-out rows). */
export function foldCrossProducts(shared: FoldShared, foldIndex: number): CrossProducts | undefined {
  if (!shared.crossProducts || !shared.blocks) return undefined;
  return subtractCrossProducts(shared.crossProducts, shared.blocks[foldIndex]);
}

/** The columns constant over a fold's training rows (from the fold ranges when the plan has them). */
export function foldConstantColumns(design: DesignMatrix, shared: FoldShared, foldIndex: number, train: number[]): Uint8Array {
  return shared.ranges ? constantOutside(shared.ranges, foldIndex, design.p) : constantColumns(design, train);
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
