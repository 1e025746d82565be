/**
 * K-fold cross-validation of a fitted path (../shared/DESIGN.md): the grid is the full-data path's,
 * each fold refits on its training rows and scores its held-out rows, and combineFolds summarizes.
 */
import { buildDesign, type BuiltDesign } from '../design/build';
import { EngineInputError, type CvResult, type EngineTable, type FitSpec, type PathOptions, type PathResult } from '../types';
import { foldAssignment } from './assign';
import { combineFolds } from './combine';
import { runFoldOnDesign } from './fold';
import { pathOptionsFromSpec } from '../path/fromSpec';

export interface CvPlan {
  built: BuiltDesign;
  options: PathOptions;
  foldIds: Int32Array;
  folds: number;
  lambda: number[];
}

/**
 * Everything the folds share: the full design, options, fold ids and the full-data grid. `built` is
 * the design the full path was fitted on, when the caller has it (saves encoding the table again).
 */
export function planCrossValidation(table: EngineTable, spec: FitSpec, path: PathResult, built?: BuiltDesign): CvPlan {
  if (!spec.cv) throw new EngineInputError('cross-validation was not requested (spec.cv is null)', 'cv');
  built ??= buildDesign(table, spec);
  const { foldIds, folds } = foldAssignment(table, spec, spec.cv, built);
  return { built, options: pathOptionsFromSpec(spec, built), foldIds, folds, lambda: path.lambda };
}

/** Runs every fold in this thread, one after another (the default; deterministic and simple). */
export function crossValidate(table: EngineTable, spec: FitSpec, path: PathResult, built?: BuiltDesign): CvResult {
  const plan = planCrossValidation(table, spec, path, built);
  const results = [];
  for (let k = 0; k < plan.folds; k++) {
    results.push(runFoldOnDesign(plan.built.design, plan.built.y, plan.options, plan.foldIds, k, plan.lambda));
  }
  return combineFolds(spec.family, plan.lambda, results, plan.foldIds);
}
