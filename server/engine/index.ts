/**
 * The engine's public entry points (see types.ts for the objectives and their scalings).
 * Callers: the CLI, fit workers, cross-validation, prediction, tests and benchmarks.
 */
export { buildDesign, findColumn, selectRows } from './design/build';
export type { BuiltDesign } from './design/build';
export { validateSpec } from './design/validate';
export { attachFolds, encodeForFit, fitPath, fitPathOnCrossProducts, fitPathOnDesign, fitPathOnOwnDesign, fitPathPrepared, plannedGrid, prepareFit } from './path/fitPath';
export type { PreparedFit } from './path/fitPath';
export { FULL_GRAM_COLUMNS, usesGram } from './path/setup';
export { crossProducts, joinBlocks, rowsByBlock, someBlockSums, subtractCrossProducts, type RowsByBlock } from './core/crossProducts';
export type { BlockCrossProducts, ColumnRange } from './core/crossProducts';
export { constantColumns } from './core/standardize';
export { computeLambdaMax, lambdaGrid } from './path/grid';
export * from './defaults';
export { createRng } from './random';
export type { Rng } from './random';
export * from './types';
// Fit workers (server/fits) run the cross-validation folds as separate queue jobs, refit and predict.
export { planCrossValidation, runPlannedFold, combineFolds, summarizeFolds, chooseLambdas, METRICS } from './cv/index';
export { areaUnderRoc, meanAbsoluteError, meanBinomialDeviance, meanSquaredError, misclassificationRate } from './cv/index';
export type { CvPlan, FoldLosses } from './cv/index';
export { refitSelected, POST_SELECTION_CAUTION } from './unpenalized/index';
export type { UnpenalizedResult } from './unpenalized/index';
