/**
 * The JSON parts of a stored fit (fits.results, fits.progress, fit_folds.losses, fit_evaluations.result).
 * The large arrays live beside them as bytes (codec.ts).
 */
import type { CvMetric, EvaluationDto, FitStage, LambdaCertificateDto } from '../../shared/fits';
import type { DesignEncoding } from '../engine/types';

export interface FitStoredProgress {
  stage: FitStage;
  lambdaIndex: number;
  lambdaCount: number | null;
  foldsDone: number;
  foldsTotal: number;
}

export interface FitStoredTimings {
  pathMs?: number;
  cvMs?: number;
  /** When the folds were queued (ms since epoch), to time the CV stage. */
  foldsQueuedAt?: number;
}

export interface FitStoredCv {
  folds: number;
  metric: CvMetric;
  mean: number[];
  standardError: number[];
  minimum: { index: number; lambda: number };
  oneStandardError: { index: number; lambda: number };
  curves: { metric: CvMetric; mean: number[]; standardError: number[] }[];
  unconvergedFolds: number[];
}

export interface FitStoredResults {
  terms: string[];
  termColumns: string[];
  termGroups: (string | null)[];
  lambda: number[];
  lambdaMax: number;
  intercept: number[];
  standardizedIntercept: number[];
  nonzero: number[];
  devianceExplained: number[];
  certificates: LambdaCertificateDto[];
  cv: FitStoredCv | null;
  encoding: DesignEncoding;
  rowsFitted: number;
  rowsDropped: number;
  holdoutRows: number;
  notes: string[];
  /** Per term: standardized x = (x - center) / scale (absent on fits stored before it was kept). */
  standardization?: { centers: number[]; scales: number[] } | null;
}

export type FoldStoredLosses = Partial<Record<CvMetric, number[]>> & { statuses: string[] };

export type StoredEvaluation = Pick<EvaluationDto, 'refit' | 'diagnostics' | 'holdout'>;
