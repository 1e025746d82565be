/** Cross-validation: folds, held-out metrics, the lambda choices (docs/engine.md, "Cross-validation"). */
export { crossValidate, crossValidatePrepared, fitPlannedFold, planCrossValidation, planFromPrepared, plannedHeldOut, runPlannedFold } from './crossValidate';
export type { CvPlan } from './crossValidate';
export { runFold, runFoldOnDesign, scoreFold, METRICS } from './fold';
export type { FoldFit, FoldLosses, FoldScratch, HeldOutRows } from './fold';
export { combineFolds, mainMetric } from './combine';
export { foldAssignment } from './assign';
export { assignFolds, foldIdsFromColumn } from './folds';
export { chooseLambdas, summarizeFolds } from './choose';
export * from './metrics';
export { foldShared, foldsUseGram, imputedPredictors, imputeFromTraining, planFolds } from './foldData';
export type { FoldPlan, FoldShared, ImputedPredictor } from './foldData';
