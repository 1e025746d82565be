import type { DesignMatrix } from '../types';
import { aliasedMessage, checkDegreesOfFreedom } from './checks';
import { waldRow } from './inference';
import { weightedLeastSquares } from './least-squares';
import type { UnpenalizedResult } from './types';

/**
 * Ordinary least squares with intercept, minimizing sum_i (y_i - b0 - x_i'b)^2 by Householder QR
 * (./least-squares.ts), with the classical inference: sigma^2 = RSS / (n - rank - 1), standard
 * errors sqrt(sigma^2 diag (X'X)^-1), t statistics and two-sided p-values on n - rank - 1 df.
 */
export function fitGaussian(design: DesignMatrix, y: Float64Array): UnpenalizedResult {
  const { n, p, x, terms } = design;
  const ls = weightedLeastSquares(n, p, x, y, null);
  const residualDf = n - ls.rank - 1;
  checkDegreesOfFreedom(n, ls.rank + 1);

  let ybar = 0;
  for (let i = 0; i < n; i++) ybar += y[i];
  ybar /= n;
  let rss = 0;
  let tss = 0;
  for (let i = 0; i < n; i++) {
    let fitted = ls.intercept;
    for (let j = 0; j < p; j++) if (!Number.isNaN(ls.beta[j])) fitted += x[j * n + i] * ls.beta[j];
    rss += (y[i] - fitted) ** 2;
    tss += (y[i] - ybar) ** 2;
  }
  const sigma2 = rss / residualDf;
  const coefficients = [];
  for (let j = 0; j < p; j++) {
    if (Number.isNaN(ls.beta[j])) continue;
    coefficients.push(waldRow(terms[j], ls.beta[j], sigma2 * ls.slopeVariance[j], residualDf));
  }
  const aliased = ls.aliased.map((j) => terms[j]);
  return {
    family: 'gaussian',
    status: aliased.length > 0 ? 'rank-deficient' : 'converged',
    message: aliased.length > 0 ? aliasedMessage(aliased) : 'Least squares solved by QR factorization.',
    n,
    intercept: waldRow('(intercept)', ls.intercept, sigma2 * ls.interceptVariance, residualDf),
    coefficients,
    aliased,
    statisticKind: 't',
    residualDf,
    residualStandardDeviation: Math.sqrt(sigma2),
    rSquared: tss > 0 ? 1 - rss / tss : null,
    deviance: rss,
    nullDeviance: tss,
    iterations: ls.refinements,
    separatedRows: 0,
    caution: null,
  };
}
