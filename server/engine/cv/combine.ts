/**
 * Per-fold held-out losses -> CvResult: the curve of each metric (mean over folds, standard error =
 * sample sd over folds / sqrt(K)) and the lambda choices on the family's main metric.
 */
import { EngineInputError, type CvCurve, type CvResult, type Family } from '../index';
import { chooseLambdas, summarizeFolds } from './choose';
import { METRICS, type FoldLosses } from './fold';

/** The metric the choices use: mean squared error (gaussian) or deviance (binomial). */
export function mainMetric(family: Family): 'mse' | 'deviance' {
  return family === 'gaussian' ? 'mse' : 'deviance';
}

export function combineFolds(
  family: Family,
  lambda: number[],
  folds: FoldLosses[],
  foldIds: Int32Array,
): CvResult {
  // Folds may arrive in any order (workers, queue jobs); sum them in fold order for identical results.
  folds = [...folds].sort((a, b) => a.fold - b.fold);
  const k = folds.length;
  const seen = new Set(folds.map((f) => f.fold));
  for (let f = 0; f < k; f++) {
    if (!seen.has(f)) throw new EngineInputError(`the result of fold ${f + 1} of ${k} is missing`, 'folds');
  }
  const curves: CvCurve[] = METRICS[family].map((metric) => {
    const perFold = folds.map((f) => {
      const values = f.losses[metric];
      if (!values || values.length !== lambda.length) {
        throw new Error(`fold ${f.fold + 1}: expected ${lambda.length} ${metric} values, got ${values?.length ?? 0}`);
      }
      return values;
    });
    return { metric, ...summarizeFolds(perFold) };
  });
  const main = curves.find((c) => c.metric === mainMetric(family)) as CvCurve;
  const { minimum, oneStandardError } = chooseLambdas(lambda, main);
  return {
    folds: k,
    metric: main.metric,
    mean: main.mean,
    standardError: main.standardError,
    minimum,
    oneStandardError,
    curves,
    foldIds,
  };
}
