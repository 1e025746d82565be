/**
 * K-fold cross-validation of a fitted path (docs/engine.md, "Cross-validation"): the grid is the full-data path's,
 * each fold refits on its training rows and scores its held-out rows, and combineFolds summarizes.
 * Uses only the engine's public entry (../index).
 */
import { EngineInputError, encodeForFit, type BuiltDesign, type CvResult, type EngineTable, type FitSpec, type PathOptions, type PathResult, type PreparedFit } from '../index';
import { combineFolds } from './combine';
import { fitFold, foldDesign, heldOutRows, runFoldOnDesign, type FoldFit, type FoldScratch, type HeldOutRows } from './fold';
import { planFolds, type FoldShared } from './foldData';

export interface CvPlan {
  built: BuiltDesign;
  options: PathOptions;
  foldIds: Int32Array;
  folds: number;
  lambda: number[];
  shared: FoldShared;
  /** This thread's reusable fold memory (fold.ts FoldScratch); not shared between threads. */
  scratch?: FoldScratch;
}

/**
 * Everything the folds share: the full design, options, fold ids, the full-data grid, and the cross
 * products / imputed cells (foldData.ts). `prepared` is what the full path was fitted from, when the
 * caller has it (saves encoding the table again, and prepareFit has planned the folds already).
 * Without it, or when it has no fold plan (a queue's fold job encodes the table itself), the folds
 * are planned here the same way, so every route gives the folds the same numbers.
 */
export function planCrossValidation(table: EngineTable, spec: FitSpec, path: PathResult, prepared?: PreparedFit): CvPlan {
  const cv = spec.cv;
  if (!cv) throw new EngineInputError('cross-validation was not requested (spec.cv is null)', 'cv');
  if (prepared?.folds) return planFromPrepared(spec, path, prepared);
  const { built, options } = prepared ?? encodeForFit(table, spec);
  const { foldIds, folds, shared } = planFolds(table, { ...spec, cv }, built, options);
  return { built, options, foldIds, folds, lambda: path.lambda, shared };
}

/**
 * The plan of a prepared fit whose folds prepareFit planned: the table is not needed again (a caller
 * can let it go before the folds run, e.g. the CLI).
 */
export function planFromPrepared(spec: FitSpec, path: PathResult, prepared: PreparedFit): CvPlan {
  if (!spec.cv) throw new EngineInputError('cross-validation was not requested (spec.cv is null)', 'cv');
  if (!prepared.folds) throw new Error('the prepared fit has no fold plan (prepareFit plans one when the spec asks for CV)');
  const { built, options } = prepared;
  const { foldIds, folds, shared } = prepared.folds;
  return { built, options, foldIds, folds, lambda: path.lambda, shared };
}

/** crossValidate on a prepared fit with its fold plan (planFromPrepared). */
export function crossValidatePrepared(spec: FitSpec, path: PathResult, prepared: PreparedFit): CvResult {
  const plan = planFromPrepared(spec, path, prepared);
  const results = [];
  for (let k = 0; k < plan.folds; k++) results.push(runPlannedFold(plan, k));
  return combineFolds(spec.family, plan.lambda, results, plan.foldIds);
}

/** Fold k of a plan in this thread. */
export function runPlannedFold(plan: CvPlan, k: number) {
  plan.scratch ??= {};
  return runFoldOnDesign(plan.built.design, plan.built.y, plan.options, plan.foldIds, k, plan.lambda, plan.shared, plan.scratch);
}

/**
 * Fold k of a plan fitted in this thread, without its scoring, and its held-out rows: runPlannedFold
 * is scoreFold(fitPlannedFold, plannedHeldOut), and the scoring may run on another thread.
 */
export function fitPlannedFold(plan: CvPlan, k: number): FoldFit {
  plan.scratch ??= {};
  const { design, y } = plan.built;
  return fitFold({ design: foldDesign(design, plan.foldIds, k, plan.shared), y, options: plan.options, foldIds: plan.foldIds, foldIndex: k, lambda: plan.lambda, shared: plan.shared, scratch: plan.scratch });
}

/** Fold k's held-out rows (see fitPlannedFold). */
export function plannedHeldOut(plan: CvPlan, k: number): HeldOutRows {
  const { design, y } = plan.built;
  return heldOutRows(foldDesign(design, plan.foldIds, k, plan.shared), y, plan.foldIds, k, plan.shared);
}

/** Runs every fold in this thread, one after another (the default; deterministic and simple). */
export function crossValidate(table: EngineTable, spec: FitSpec, path: PathResult, prepared?: PreparedFit): CvResult {
  const plan = planCrossValidation(table, spec, path, prepared);
  const results = [];
  for (let k = 0; k < plan.folds; k++) results.push(runPlannedFold(plan, k));
  return combineFolds(spec.family, plan.lambda, results, plan.foldIds);
}
