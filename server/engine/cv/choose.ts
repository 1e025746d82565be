/**
 * Summaries of per-fold losses and the two lambda choices of docs/engine.md ("Cross-validation"): the minimum of
 * the CV curve and the one-standard-error rule (Breiman, Friedman, Olshen & Stone 1984, CART,
 * section 3.4.3; Hastie, Tibshirani & Friedman 2009, ESL section 7.10).
 */

export interface CurveSummary {
  mean: number[];
  standardError: number[];
}

/**
 * `perFold[k][l]` is fold k's mean held-out loss at lambda l. Mean over folds, and standard error =
 * sample standard deviation over folds (divisor K - 1) / sqrt(K). Undefined fold values (NaN, e.g.
 * the AUC of a held-out set with one class) are left out of that lambda's summary; with fewer than
 * two defined folds the standard error is NaN.
 */
export function summarizeFolds(perFold: number[][]): CurveSummary {
  const nLambda = perFold.length === 0 ? 0 : perFold[0].length;
  const mean: number[] = [];
  const standardError: number[] = [];
  for (let l = 0; l < nLambda; l++) {
    const values = perFold.map((fold) => fold[l]).filter((v) => !Number.isNaN(v));
    const k = values.length;
    const m = k === 0 ? Number.NaN : values.reduce((a, b) => a + b, 0) / k;
    let ss = 0;
    for (const v of values) ss += (v - m) * (v - m);
    mean.push(m);
    standardError.push(k < 2 ? Number.NaN : Math.sqrt(ss / (k - 1)) / Math.sqrt(k));
  }
  return { mean, standardError };
}

export interface LambdaChoice {
  index: number;
  lambda: number;
}

/**
 * Lower is better. `lambda` is descending, so among equal minima the first index (the largest lambda,
 * the sparser model) wins. One-SE: the largest lambda whose mean is within one standard error of the
 * minimum; with an undefined standard error (K < 2 usable folds) that is the minimum itself.
 */
export function chooseLambdas(
  lambda: number[],
  curve: CurveSummary,
): { minimum: LambdaChoice; oneStandardError: LambdaChoice } {
  let best = -1;
  for (let l = 0; l < lambda.length; l++) {
    const v = curve.mean[l];
    if (Number.isNaN(v)) continue;
    if (best < 0 || v < curve.mean[best]) best = l;
  }
  if (best < 0) throw new Error('cross-validation produced no finite error at any lambda');
  const se = curve.standardError[best];
  const threshold = curve.mean[best] + (Number.isNaN(se) ? 0 : se);
  let oneSe = best;
  for (let l = 0; l < best; l++) {
    if (curve.mean[l] <= threshold) {
      oneSe = l;
      break;
    }
  }
  return {
    minimum: { index: best, lambda: lambda[best] },
    oneStandardError: { index: oneSe, lambda: lambda[oneSe] },
  };
}
