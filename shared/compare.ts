/**
 * Comparing fits (GET /api/workspaces/:workspaceId/comparisons?fits=ID,ID,...): versions of one model,
 * or models on the same outcome. The first fit is the baseline the others are compared with.
 */
import type { ChoiceRule, CvMetric, DatasetVersionRef, SpecChangeDto } from './fits';
import type { FitFamily } from './models';

export const MIN_COMPARE = 2;
export const MAX_COMPARE = 6;

export interface ComparedFitDto {
  id: string;
  modelId: string;
  modelName: string;
  version: number;
  outcome: string;
  family: FitFamily;
  unconverged: boolean;
  datasetVersion: DatasetVersionRef;
  engineVersion: string;
  chosen: { index: number; lambda: number; rule: ChoiceRule };
  nonzero: number;
  devianceExplained: number;
  /** CV error at the chosen lambda, with its standard error over folds (null without CV). */
  cv: { metric: CvMetric; mean: number; standardError: number; folds: number } | null;
  holdout: { rowCount: number; metrics: { name: string; value: number }[] } | null;
}

/** One term across the fits: its coefficient (original scale) at each fit's chosen lambda, 0 when not kept, null when the fit lacks the term. */
export interface ComparedTermDto {
  term: string;
  values: (number | null)[];
  /** Share of CV folds keeping the term at each fit's chosen lambda (null without CV or term). */
  stability: (number | null)[];
}

export type SelectionChangeKind = 'entered' | 'left' | 'changed-sign';
export const SELECTION_CHANGE_LABELS: Record<SelectionChangeKind, string> = {
  entered: 'Entered',
  left: 'Left',
  'changed-sign': 'Changed sign',
};

export interface SelectionChangeDto {
  term: string;
  kind: SelectionChangeKind;
  baseline: number | null;
  other: number | null;
  baselineStability: number | null;
  otherStability: number | null;
}

export interface MetricDifferenceDto {
  name: string;
  baseline: number;
  other: number;
  /** other - baseline */
  difference: number;
  /**
   * sqrt(se_baseline^2 + se_other^2): treats the two estimates as independent. Fits scored on the same
   * folds are positively correlated, so this overstates the uncertainty of their difference.
   * null where no standard error exists (holdout numbers, deviance explained).
   */
  standardError: number | null;
  /** True when lower is better (errors); false for AUC and deviance explained. */
  lowerIsBetter: boolean;
}

export interface ComparisonPairDto {
  /** Index into fits (1, 2, ...): compared with fits[0]. */
  other: number;
  specChanges: SpecChangeDto[];
  selection: SelectionChangeDto[];
  metrics: MetricDifferenceDto[];
  /** Plain notes on what makes the pair hard to compare (different data, metric, folds...). */
  notes: string[];
}

export interface ComparisonDto {
  fits: ComparedFitDto[];
  terms: ComparedTermDto[];
  pairs: ComparisonPairDto[];
}
