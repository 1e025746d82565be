/**
 * The engine runner: what owns threads around the engine (server/engine is pure functions on arrays
 * and starts none). Cross-validation folds spread over worker threads; callers: the CLI, fit workers.
 */
export { coreToSpare, cpuSnapshot, MIN_SPARE_CORE_SHARE, crossValidateAdaptive, crossValidateInWorkers, crossValidateInWorkersPrepared, attachFoldsBeside, fitPathAndFolds, FoldWorker, runFoldsShared, startFoldWorker, foldWork, threadsPay, THREAD_WORK_THRESHOLD, crossValidateScoringBeside, scoringBesidePays, SCORING_WORK_THRESHOLD } from './parallel';
