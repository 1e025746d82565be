import { DualContext } from '../core/dual';
import { gramFromCrossProducts } from '../core/crossProducts';
import { GramCache } from '../core/gram';
import { buildBlockPenalty } from '../core/penalty';
import type { Problem } from '../core/problem';
import { standardizeDesign, type StandardizedDesign } from '../core/standardize';
import { EngineInputError, type CrossProducts, type DesignMatrix, type PathOptions } from '../types';
import { GRAM_FAMILIES, lossFor, RESPONSE_RULES, type LossRole, type NullFit } from '../core/loss';
import { penaltyLambdaMax } from '../core/penalty';

export interface PreparedProblem {
  problem: Problem;
  std: StandardizedDesign;
  nullFit: NullFit;
  dual: DualContext;
  lambdaMax: number;
}

/**
 * Checks PathOptions on a design; throws EngineInputError naming the field. `valuesChecked`: the
 * design comes from buildDesign, whose values are finite by construction, so its rows are not
 * scanned again (one pass over n x p values: ~18 ms on 20000 x 200).
 */
export function checkPathOptions(design: DesignMatrix, y: Float64Array, options: PathOptions, valuesChecked = false): void {
  const { n, p } = design;
  if (n < 2) throw new EngineInputError(`at least two rows are needed to fit; got ${n}`, 'data');
  if (y.length !== n) throw new EngineInputError(`response has ${y.length} values for ${n} rows`, 'response');
  if (options.penalty === 'elastic-net') {
    if (options.l1Share === undefined) throw new EngineInputError('the elastic-net penalty needs an L1 share in (0, 1] (1 = lasso, towards 0 = ridge)', 'l1Share');
    if (!(options.l1Share > 0 && options.l1Share <= 1)) throw new EngineInputError(`L1 share must be in (0, 1]; got ${options.l1Share}`, 'l1Share');
  } else if (options.l1Share !== undefined) {
    throw new EngineInputError(`L1 share applies only to the elastic-net penalty (this fit is ${options.penalty})`, 'l1Share');
  }
  if (options.lambda) {
    if (options.lambda.length === 0) throw new EngineInputError('lambda: give at least one value', 'lambda');
    options.lambda.forEach((l, k) => {
      if (!Number.isFinite(l) || l < 0) throw new EngineInputError(`lambda values must be finite and >= 0; value ${k + 1} is ${l}`, 'lambda');
      if (k > 0 && !(l < options.lambda![k - 1])) {
        throw new EngineInputError(`lambda values must be strictly descending; value ${k + 1} (${l}) follows ${options.lambda![k - 1]}`, 'lambda');
      }
    });
  }
  if (options.pathLength !== undefined && !(Number.isInteger(options.pathLength) && options.pathLength >= 1)) {
    throw new EngineInputError(`path length must be a whole number >= 1; got ${options.pathLength}`, 'pathLength');
  }
  if (options.pathDecades !== undefined && !(options.pathDecades > 0 && Number.isFinite(options.pathDecades))) {
    throw new EngineInputError(`path decades must be a positive number; got ${options.pathDecades}`, 'pathDecades');
  }
  if (options.maxTerms !== undefined && !(Number.isInteger(options.maxTerms) && options.maxTerms >= 1)) {
    throw new EngineInputError(`max terms must be a whole number >= 1; got ${options.maxTerms}`, 'maxTerms');
  }
  if (options.tolerance !== undefined && !(options.tolerance > 0 && Number.isFinite(options.tolerance))) {
    throw new EngineInputError(`tolerance must be a positive number; got ${options.tolerance}`, 'tolerance');
  }
  if (options.maxIterations !== undefined && !(Number.isInteger(options.maxIterations) && options.maxIterations >= 1)) {
    throw new EngineInputError(`iteration limit must be a whole number >= 1; got ${options.maxIterations}`, 'maxIterations');
  }
  const weights = options.penaltyWeights;
  if (weights) {
    if (weights.length !== p) throw new EngineInputError(`penalty weights: ${weights.length} values for ${p} columns`, 'penaltyWeights');
    for (let j = 0; j < p; j++) {
      if (!(weights[j] >= 0 && Number.isFinite(weights[j]))) {
        throw new EngineInputError(`penalty weight of "${design.terms[j]}" must be finite and >= 0; got ${weights[j]}`, 'penaltyWeights');
      }
    }
  }
  if (options.groupOfTerm && options.groupOfTerm.length !== p) {
    throw new EngineInputError(`groups: ${options.groupOfTerm.length} assignments for ${p} columns`, 'groups');
  }
  if (options.groupWeights) {
    for (let g = 0; g < options.groupWeights.length; g++) {
      if (!(options.groupWeights[g] >= 0 && Number.isFinite(options.groupWeights[g]))) {
        throw new EngineInputError(`group weight ${g} must be finite and >= 0; got ${options.groupWeights[g]}`, 'groups');
      }
    }
  }
  const rules = RESPONSE_RULES[options.family];
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(y[i])) throw new EngineInputError(`response has a non-finite value in row ${i + 1}`, 'response');
    const invalid = rules.invalid(y[i], i + 1);
    if (invalid) throw new EngineInputError(invalid, 'response');
  }
  // A design from buildDesign is finite by construction (it rejects non-finite cells): `valuesChecked`.
  if (valuesChecked) return;
  for (let k = 0; k < n * p; k++) {
    if (!Number.isFinite(design.x[k])) {
      const j = Math.floor(k / n);
      throw new EngineInputError(`column "${design.terms[j]}" has a non-finite value in row ${(k % n) + 1}`, design.terms[j]);
    }
  }
}

/** Up to this many columns the Gram form computes all of G at once (see prepareProblem). */
export const FULL_GRAM_COLUMNS = 500;

/**
 * Above this many columns the Gram form is not used: its columns are cached as they are needed and
 * all of G is p^2 * 8 bytes (32 MB at 2000 columns, 200 MB at 5000), and a long path touches most
 * columns through its KKT checks, so the cache would grow towards all of it.
 */
export const MAX_GRAM_COLUMNS = 2000;

/**
 * Gram form for gaussian fits when n is well above p (n >= 2p: one Gram column, p products of
 * length n, is then cheaper to reuse than to recompute n-long residual products every iteration)
 * and p <= MAX_GRAM_COLUMNS, unless overridden (docs/decisions/0015-gram-form.md).
 */
export function usesGram(options: PathOptions, n: number, p: number): boolean {
  if (!GRAM_FAMILIES.has(options.family)) return false;
  if (options.gram === 'always') return true;
  if (options.gram === 'never') return false;
  return n >= 2 * p && p <= MAX_GRAM_COLUMNS;
}

/** `overwrite`: design.x is the caller's own copy and may become the standardized one (standardizeDesign). */
export function prepareProblem(design: DesignMatrix, y: Float64Array, options: PathOptions, overwrite = false): PreparedProblem {
  const { n, p } = design;
  const std = standardizeDesign(design, options.standardize, overwrite);
  let yMean = 0;
  for (let i = 0; i < n; i++) yMean += y[i];
  yMean /= n;
  const { centred } = RESPONSE_RULES[options.family];
  const yWork = new Float64Array(n);
  let yy = 0;
  for (let i = 0; i < n; i++) {
    yWork[i] = centred ? y[i] - yMean : y[i];
    yy += (y[i] - yMean) * (y[i] - yMean);
  }
  checkResponse(options, yMean, yy);
  const c = new Float64Array(p);
  const colNormSq = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let s = 0;
    let sq = 0;
    const off = j * n;
    for (let i = 0; i < n; i++) {
      s += std.x[off + i] * yWork[i];
      sq += std.x[off + i] * std.x[off + i];
    }
    c[j] = centred ? s / n : 0;
    colNormSq[j] = sq;
  }
  for (let j = 0; j < p; j++) {
    if (!Number.isFinite(colNormSq[j]) || !Number.isFinite(c[j])) {
      throw new EngineInputError(`column "${design.terms[j]}" has values too large to fit (their squares overflow); rescale it`, design.terms[j]);
    }
  }
  const form = usesGram(options, n, p) ? 'gram' : 'design';
  const gram = new GramCache(std.x, n, p);
  // With few columns a path ends up needing nearly all of G; computing it in one sweep of panels
  // is cheaper than column by column as the working set grows.
  if (form === 'gram' && options.crossProducts) gramFromCrossProducts(gram, options.crossProducts, n, std.centers, std.scales);
  else if (form === 'gram' && p <= FULL_GRAM_COLUMNS) gram.ensure(Int32Array.from({ length: p }, (_, j) => j));
  return finishProblem(options, std, { y: yWork, yMean, yy, c, colNormSq, gram, form });
}

function checkResponse(options: PathOptions, yMean: number, yy: number): void {
  RESPONSE_RULES[options.family].checkSpread(yMean, yy);
}

/**
 * The gaussian Gram form from cross products alone (a CV fold: S(all) - S(held out), response
 * included, crossProducts.ts), without touching the rows: centres, scales, G, c = X'yc/n, ||yc||^2
 * and the column norms all follow from the sums. `constant` marks columns constant over the rows
 * (found by the caller from the values: sums cannot tell a constant column exactly). The problem has
 * no X: only Gram-form code runs on it (no lambda = 0 factorization; the caller checks).
 */
export function prepareGramProblem(cp: CrossProducts, constant: Uint8Array, terms: string[], options: PathOptions): PreparedProblem {
  const n = cp.rows;
  const p = cp.center.length;
  const response = cp.response;
  if (!response || !cp.colSums) throw new EngineInputError('cross products: the response and column sums are needed', 'crossProducts');
  const centers = new Float64Array(p);
  const scales = new Float64Array(p);
  const shift = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    shift[j] = cp.colSums[j] / n;
    centers[j] = cp.center[j] + shift[j];
    if (constant[j]) continue;
    const variance = Math.max(0, cp.sums[j * p + j] / n - shift[j] * shift[j]);
    scales[j] = options.standardize ? Math.sqrt(variance) : 1;
  }
  const yShift = response.sum / n;
  const yMean = response.center + yShift;
  const yy = response.squares - n * yShift * yShift;
  checkResponse(options, yMean, yy);
  const c = new Float64Array(p);
  for (let j = 0; j < p; j++) if (scales[j] > 0) c[j] = (response.cross[j] - n * shift[j] * yShift) / (n * scales[j]);
  const empty = new Float64Array(0);
  const gram = new GramCache(empty, n, p);
  gramFromCrossProducts(gram, cp, n, centers, scales);
  const colNormSq = Float64Array.from({ length: p }, (_, j) => n * gram.column(j)[j]);
  for (let j = 0; j < p; j++) {
    if (!Number.isFinite(colNormSq[j]) || !Number.isFinite(c[j])) {
      throw new EngineInputError(`column "${terms[j]}" has values too large to fit (their squares overflow); rescale it`, terms[j]);
    }
  }
  const std: StandardizedDesign = { n, p, x: empty, centers, scales, constant };
  return finishProblem(options, std, { y: empty, yMean, yy, c, colNormSq, gram, form: 'gram' });
}

interface ProblemParts {
  y: Float64Array;
  yMean: number;
  yy: number;
  c: Float64Array;
  colNormSq: Float64Array;
  gram: GramCache;
  form: 'design' | 'gram';
}

/** The penalty, the loss, the null fit, lambda_max and the dual context of a problem. */
function finishProblem(options: PathOptions, std: StandardizedDesign, parts: ProblemParts): PreparedProblem {
  const { n, p } = std;
  const isGroup = options.penalty === 'group-lasso';
  const alpha = options.penalty === 'elastic-net' ? (options.l1Share as number) : 1;
  const weightOf = (j: number): number => (options.penaltyWeights ? options.penaltyWeights[j] : 1);
  const penalty = buildBlockPenalty(p, std.constant, alpha, isGroup ? (options.groupOfTerm ?? null) : null, (id, size, members) =>
    isGroup ? (options.groupWeights && id < options.groupWeights.length ? options.groupWeights[id] : Math.sqrt(size)) * weightOf(members[0]) : weightOf(members[0]),
  );
  const problem: Problem = {
    family: options.family,
    n,
    p,
    x: std.x,
    y: parts.y,
    yMean: parts.yMean,
    yy: parts.yy,
    c: parts.c,
    gram: parts.gram,
    loss: undefined as unknown as LossRole,
    penalty,
    colNormSq: parts.colNormSq,
    nullObjective: 0,
  };
  problem.loss = lossFor(problem, parts.form);
  problem.nullObjective = problem.loss.nullObjective;
  const fixedU: number[] = [];
  for (let u = 0; u < penalty.nBlocks; u++) {
    if (penalty.weight[u] === 0) for (let i = penalty.start[u]; i < penalty.start[u + 1]; i++) fixedU.push(penalty.features[i]);
  }
  const nullFit = problem.loss.nullFit(Int32Array.from(fixedU), {});
  const lambdaMax = penaltyLambdaMax(penalty, nullFit.g);
  if (!Number.isFinite(lambdaMax)) throw new EngineInputError('the data are too large in scale to fit; rescale the columns or standardize', 'data');
  const dual = new DualContext(problem, nullFit.theta, nullFit.g, lambdaMax);
  return { problem, std, nullFit, dual, lambdaMax };
}
