/**
 * The one place where the API's fit spec (shared vocabulary: l1Share, penaltyWeights, pathDecades,
 * maxTerms, devianceExplained) meets the engine's own names. When the engine is renamed, only this
 * file changes.
 */
import type { FitSpec } from '../../shared/fits';
import type { FitSpec as EngineFitSpec, PathResult } from '../engine/index';

/** The engine's spec for a stored fit spec (cross-validation included, with the given fold column). */
export function engineSpec(spec: FitSpec): EngineFitSpec {
  const explicit = spec.path.kind === 'explicit' ? spec.path.lambdas : undefined;
  const automatic = spec.path.kind === 'automatic' ? spec.path : undefined;
  return {
    family: spec.family,
    response: spec.outcome,
    predictors: spec.predictors,
    penalty: spec.penalty,
    alpha: spec.penalty === 'elastic-net' ? (spec.l1Share ?? 1) : 1,
    groups: spec.penalty === 'group-lasso' ? spec.groups : undefined,
    penaltyFactors: spec.penaltyWeights,
    standardize: spec.standardize,
    lambda: explicit,
    pathLength: explicit ? explicit.length : (automatic?.pathLength ?? 100),
    lambdaRatio: automatic?.pathDecades !== undefined ? 10 ** -automatic.pathDecades : undefined,
    ...(spec.tolerance !== undefined ? { tolerance: spec.tolerance } : { tolerance: DEFAULT_TOLERANCE }),
    maxIterations: spec.maxIterations ?? DEFAULT_MAX_ITERATIONS,
    screening: 'strong',
    missing: spec.missing,
    cv:
      spec.cv.kind === 'folds'
        ? { folds: spec.cv.folds, seed: spec.cv.seed }
        : spec.cv.kind === 'column'
          ? { folds: 0, seed: 0, foldColumn: spec.cv.column }
          : null,
  };
}

/** The engine's defaults today (path/fitPath.ts); recorded in each stored spec's engine version. */
const DEFAULT_TOLERANCE = 1e-7;
const DEFAULT_MAX_ITERATIONS = 10000;

/** Per-lambda fraction of deviance explained, under the shared name. */
export function devianceExplained(path: PathResult): number[] {
  return path.devianceRatio;
}

/**
 * maxTerms: the path ends after the first lambda with more than maxTerms nonzero terms. Until the
 * engine does this itself, the full path is cut here; warm starts run in order, so the kept prefix is
 * exactly what an engine stopping there would return.
 */
export function applyMaxTerms(path: PathResult, maxTerms: number | undefined): PathResult {
  if (maxTerms === undefined) return path;
  const end = path.nonzero.findIndex((k) => k > maxTerms);
  if (end < 0 || end === path.lambda.length - 1) return path;
  const keep = end + 1;
  return {
    ...path,
    lambda: path.lambda.slice(0, keep),
    intercept: path.intercept.slice(0, keep),
    coefficients: path.coefficients.slice(0, keep),
    standardizedIntercept: path.standardizedIntercept.slice(0, keep),
    standardizedCoefficients: path.standardizedCoefficients.slice(0, keep),
    solves: path.solves.slice(0, keep),
    nonzero: path.nonzero.slice(0, keep),
    devianceRatio: path.devianceRatio.slice(0, keep),
    notes: [...path.notes, `the path ends after lambda ${keep}: its model has more than ${maxTerms} nonzero terms`],
  };
}
