import { buildDesign, type BuiltDesign } from '../design/build';
import { validateSpec } from '../design/validate';
import { EngineInputError, type CrossProducts, type DesignMatrix, type EngineTable, type FitSpec, type PathOptions, type PathResult, type SolveInfo } from '../types';
import { lambdaGrid } from './grid';
import { DEFAULT_MAX_ITERATIONS, DEFAULT_PATH_DECADES, DEFAULT_PATH_LENGTH, DEFAULT_TOLERANCE } from '../defaults';
import { pathOptionsFromSpec } from './fromSpec';
import { checkPathOptions, FULL_GRAM_COLUMNS, prepareGramProblem, prepareProblem, usesGram, type PreparedProblem } from './setup';
import { crossProducts } from '../core/crossProducts';
import { constantColumns } from '../core/standardize';
import { newPathState, solveAtLambda, type PathState } from './solveAtLambda';
import { solveAtZero } from './atZero';
import { planFolds, type FoldPlan } from '../cv/foldData';

/**
 * Fits the regularization path on an encoded design (objectives in types.ts). Standardization is
 * learnt from these rows. The path (scikit-learn's path functions are the model, STYLE.md 11): exact
 * lambda_max from the null model, the log-spaced grid or the explicit lambdas, warm starts, screening
 * and one typed SolveInfo per lambda. With options.maxTerms the path ends after the first lambda
 * whose model has more than maxTerms nonzero terms (that lambda is kept, so the crossing is shown);
 * explicit lambdas are all fitted.
 */
export function fitPathOnDesign(design: DesignMatrix, y: Float64Array, options: PathOptions): PathResult {
  checkPathOptions(design, y, options);
  return runPath(prepareProblem(design, y, options), design.terms, options, { design, y });
}

/**
 * fitPathOnDesign on a design the caller gives away (a CV fold's copy of its training rows): its
 * values become the standardized ones instead of being copied again. Not with lambda = 0 in the
 * grid (that factorization reads the original rows), where it is fitPathOnDesign.
 */
export function fitPathOnOwnDesign(design: DesignMatrix, y: Float64Array, options: PathOptions): PathResult {
  if (options.lambda?.includes(0) || !options.lambda) return fitPathOnDesign(design, y, options);
  checkPathOptions(design, y, options);
  return runPath(prepareProblem(design, y, options, true), design.terms, options, null);
}

/**
 * The gaussian Gram-form path from cross products alone (a CV fold's training rows as
 * S(all) - S(held out), with the response; setup.ts prepareGramProblem): no copy, centring or
 * scaling of the rows. `constant` marks the columns constant over those rows. Not for grids with
 * lambda = 0 (its exact factorization needs the rows).
 */
export function fitPathOnCrossProducts(terms: string[], cp: CrossProducts, constant: Uint8Array, options: PathOptions): PathResult {
  if (options.lambda?.includes(0)) throw new EngineInputError('lambda = 0 needs the rows, not only their cross products', 'lambda');
  return runPath(prepareGramProblem(cp, constant, terms, options), terms, options, null);
}

function runPath(prepared: PreparedProblem, terms: string[], options: PathOptions, rows: { design: DesignMatrix; y: Float64Array } | null): PathResult {
  const { problem, std, nullFit, dual, lambdaMax } = prepared;
  const { p } = std;
  const notes: string[] = [];
  for (let j = 0; j < p; j++) {
    if (std.constant[j]) notes.push(`column "${terms[j]}" is constant over the rows fitted; its coefficient is 0`);
  }
  // maxTerms shapes the automatic path only: explicit lambdas (a user's list, or the full-data grid
  // each cross-validation fold refits) are all fitted.
  const automatic = !options.lambda;
  let grid = options.lambda ? [...options.lambda] : null;
  if (!grid) {
    if (lambdaMax > 0) grid = lambdaGrid(lambdaMax, options.pathLength ?? DEFAULT_PATH_LENGTH, options.pathDecades ?? DEFAULT_PATH_DECADES);
    else {
      notes.push('no penalized column has a non-zero gradient at the null model: the path is the single lambda 0');
      grid = [0];
    }
  }
  const tolerance = options.tolerance ?? DEFAULT_TOLERANCE;
  const state = newPathState(Float64Array.from(nullFit.coef), nullFit.intercept, Float64Array.from(nullFit.g), problem.nullObjective);
  const result: PathResult = {
    family: options.family,
    terms: [...terms],
    lambda: [],
    lambdaMax,
    intercept: [],
    coefficients: [],
    standardizedIntercept: [],
    standardizedCoefficients: [],
    solves: [],
    nonzero: [],
    devianceExplained: [],
    notes,
    centers: std.centers,
    scales: std.scales,
    nullObjective: problem.nullObjective,
  };
  let previous = Math.max(lambdaMax, grid[0]);
  for (const lambda of grid) {
    if (lambda === 0 && rows) {
      const zero = solveAtZero(rows.design, rows.y, problem, dual, std, state, tolerance);
      if ('info' in zero) {
        record(result, state, zero.info, lambda, std, options.standardize, problem);
        // The factorization's own original-scale numbers, not a round trip through the scales.
        result.intercept[result.intercept.length - 1] = zero.intercept;
        result.coefficients[result.coefficients.length - 1] = zero.coefficients;
        notes.push(zero.note);
        continue;
      }
      notes.push(`lambda = 0: the unpenalized factorization is not possible (${zero.fallback}); solved by the iterative solver instead`);
    }
    const info: SolveInfo = solveAtLambda(problem, dual, state, {
      lambda,
      previousLambda: previous,
      tolerance,
      maxIterations: options.maxIterations ?? DEFAULT_MAX_ITERATIONS,
      screening: options.screening ?? 'strong',
      polish: options.polish ?? true,
    });
    previous = lambda;
    record(result, state, info, lambda, std, options.standardize, problem);
    options.onLambda?.(result.lambda.length, grid.length);
    const terms = result.nonzero[result.nonzero.length - 1];
    if (automatic && options.maxTerms !== undefined && terms > options.maxTerms && result.lambda.length < grid.length) {
      notes.push(`path ended after ${result.lambda.length} of ${grid.length} lambdas: the model at lambda ${lambda} has ${terms} nonzero terms, more than the limit of ${options.maxTerms}`);
      break;
    }
  }
  return result;
}

function record(
  result: PathResult,
  state: PathState,
  info: SolveInfo,
  lambda: number,
  std: PreparedProblem['std'],
  standardize: boolean,
  problem: PreparedProblem['problem'],
): void {
  const p = state.coef.length;
  const standardized = Float64Array.from(state.coef);
  const original = new Float64Array(p);
  let nonzero = 0;
  // Losses without an intercept slot (gaussian) have the closed-form intercept mean(y) on centred columns.
  const internalIntercept = problem.loss.intercept ? state.intercept : problem.yMean;
  let intercept = internalIntercept;
  for (let j = 0; j < p; j++) {
    if (standardized[j] === 0 || std.scales[j] === 0) continue;
    nonzero++;
    original[j] = standardized[j] / std.scales[j];
    intercept -= std.centers[j] * original[j];
  }
  result.lambda.push(lambda);
  result.coefficients.push(original);
  result.intercept.push(intercept);
  result.standardizedCoefficients.push(standardize ? standardized : original);
  // On the standardized scale the columns are centred, so the intercept is the internal one.
  result.standardizedIntercept.push(standardize ? internalIntercept : intercept);
  result.solves.push(info);
  result.nonzero.push(nonzero);
  result.devianceExplained.push(1 - state.loss / problem.nullObjective);
}

/** A spec checked against its table, encoded, and mapped to the options of the design-level fit. */
export interface PreparedFit {
  built: BuiltDesign;
  options: PathOptions;
  /**
   * Cross products of all rows, set by fitPathPrepared when the full Gram form is used: the full
   * path's Gram comes from them, and cross-validation subtracts each fold's held-out rows from them.
   */
  crossProducts?: CrossProducts;
  /**
   * With cross-validation: the folds, planned before the full path (prepareFit). In the Gram form
   * their shared data hold the cross products of each fold's rows, and S(all) is their sum: one
   * pass over the rows serves the full path (crossProducts above) and every fold.
   */
  folds?: FoldPlan;
}

/**
 * validateSpec, then encodeForFit: the table-level steps every fit shares; with cross-validation the
 * folds are planned too (cv/foldData.ts planFolds), so the full path and the folds share one set of
 * cross products. Every route that fits a path with CV (CLI, in-process, studio path job) comes
 * through here, so the full path's numbers do not depend on the route. `sharedMemory`: the design in
 * a SharedArrayBuffer (buildDesign), for a caller that hands it to worker threads.
 */
export function prepareFit(table: EngineTable, spec: FitSpec, withFolds = true, sharedMemory = false): PreparedFit {
  validateSpec(table, spec);
  const prepared = encodeForFit(table, spec, sharedMemory);
  if (withFolds) attachFolds(table, spec, prepared);
  return prepared;
}

/**
 * prepareFit's fold planning, for a caller that prepared with `withFolds` false to compute the
 * blocks its own way (the runner, over threads: the same numbers): with the spec's CV, the fold
 * plan, and S(all) from its blocks as the full path's cross products. `regroup`: see foldShared.
 */
export function attachFolds(table: EngineTable, spec: FitSpec, prepared: PreparedFit, given?: Parameters<typeof planFolds>[4], regroup = false): void {
  const cv = spec.cv;
  if (!cv) return;
  prepared.folds = planFolds(table, { ...spec, cv }, prepared.built, prepared.options, given, regroup);
  prepared.crossProducts = prepared.folds.shared.crossProducts;
}

/**
 * buildDesign and the spec's PathOptions, for a spec already validated (e.g. a fold job repeating
 * the full fit's encoding).
 */
export function encodeForFit(table: EngineTable, spec: FitSpec, sharedMemory = false): PreparedFit {
  const built = buildDesign(table, spec, undefined, sharedMemory);
  if (built.design.p === 0) {
    throw new EngineInputError('no usable predictor: every predictor is constant over the rows used', 'predictors');
  }
  if (built.design.n < 2) throw new EngineInputError(`only ${built.design.n} row remains after removing missing values`, 'data');
  return { built, options: pathOptionsFromSpec(spec, built) };
}

/**
 * Table level, keeping the encoded design (cross-validation reuses it instead of encoding the table
 * again): fitPathOnDesign on a prepareFit result; the result carries the build's notes and the
 * encoding. In the full Gram form the Gram matrix comes from the cross products of all rows, which
 * are kept in `prepared` for cross-validation's folds.
 */
export function fitPathPrepared(prepared: PreparedFit): PathResult {
  const { built, options } = prepared;
  const cp = ensureCrossProducts(prepared);
  // The Gram form needs the rows only to check them: the problem comes from the cross products.
  let result: PathResult;
  if (cp?.response && !options.lambda?.includes(0)) {
    checkPathOptions(built.design, built.y, options, true);
    result = fitPathOnCrossProducts(built.design.terms, cp, constantColumns(built.design), options);
  } else {
    result = fitPathOnDesign(built.design, built.y, cp ? { ...options, crossProducts: cp } : options);
  }
  result.notes.unshift(...built.notes);
  result.encoding = built.encoding;
  return result;
}

/** The cross products of all rows when the full Gram form is used (kept in `prepared`). */
function ensureCrossProducts(prepared: PreparedFit): CrossProducts | undefined {
  const { built, options } = prepared;
  const { n, p } = built.design;
  if (!prepared.crossProducts && p <= FULL_GRAM_COLUMNS && usesGram(options, n, p)) prepared.crossProducts = crossProducts(built.design, undefined, undefined, built.y);
  return prepared.crossProducts;
}

/**
 * The lambdas fitPathPrepared will fit, when they are known before any solve: the explicit grid, or
 * the automatic one (lambda_max from the same problem set-up the path makes; a set-up's cost, no
 * solve). Null with maxTerms on an automatic grid (where the path ends depends on its solves).
 * Lets cross-validation folds start while the full path is still being fitted.
 */
export function plannedGrid(prepared: PreparedFit): number[] | null {
  const { built, options } = prepared;
  if (options.lambda) return [...options.lambda];
  if (options.maxTerms !== undefined) return null;
  checkPathOptions(built.design, built.y, options, true);
  const cp = ensureCrossProducts(prepared);
  const { lambdaMax } = cp?.response
    ? prepareGramProblem(cp, constantColumns(built.design), built.design.terms, options)
    : prepareProblem(built.design, built.y, cp ? { ...options, crossProducts: cp } : options);
  return lambdaMax > 0 ? lambdaGrid(lambdaMax, options.pathLength ?? DEFAULT_PATH_LENGTH, options.pathDecades ?? DEFAULT_PATH_DECADES) : [0];
}

/** Table level: prepareFit, then fitPathOnDesign; the result carries the encoding. */
export function fitPath(table: EngineTable, spec: FitSpec): PathResult {
  return fitPathPrepared(prepareFit(table, spec));
}
