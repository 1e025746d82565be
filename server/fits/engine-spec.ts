/**
 * The one place where the API's stored fit spec (shared/fits.ts) becomes the engine's spec. Both
 * use the same vocabulary (l1Share, penaltyWeights, pathDecades, maxTerms); the shapes differ
 * (the API nests the path and the cross-validation choice).
 */
import type { FitSpec } from '../../shared/fits';
import { DEFAULT_MAX_ITERATIONS, DEFAULT_PATH_LENGTH, DEFAULT_TOLERANCE, type FitSpec as EngineFitSpec } from '../engine/index';

/** The engine's spec for a stored fit spec (cross-validation included, with the given fold column). */
export function engineSpec(spec: FitSpec): EngineFitSpec {
  const explicit = spec.path.kind === 'explicit' ? spec.path.lambdas : undefined;
  const automatic = spec.path.kind === 'automatic' ? spec.path : undefined;
  return {
    family: spec.family,
    response: spec.outcome,
    predictors: spec.predictors,
    penalty: spec.penalty,
    ...(spec.penalty === 'elastic-net' ? { l1Share: spec.l1Share } : {}),
    groups: spec.penalty === 'group-lasso' ? spec.groups : undefined,
    penaltyWeights: spec.penaltyWeights,
    standardize: spec.standardize,
    lambda: explicit,
    pathLength: explicit ? explicit.length : (automatic?.pathLength ?? DEFAULT_PATH_LENGTH),
    ...(automatic?.pathDecades !== undefined ? { pathDecades: automatic.pathDecades } : {}),
    ...(automatic?.maxTerms !== undefined ? { maxTerms: automatic.maxTerms } : {}),
    tolerance: spec.tolerance ?? DEFAULT_TOLERANCE,
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
