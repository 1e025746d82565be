import { logisticRows } from '../core/logisticRows';
import type { DesignMatrix } from '../types';
import { aliasedMessage, checkDegreesOfFreedom } from './checks';
import { waldRow } from './inference';
import { weightedLeastSquares, type LeastSquaresFit } from './least-squares';
import type { UnpenalizedOptions, UnpenalizedResult, UnpenalizedStatus } from './types';

/**
 * Logistic regression by maximum likelihood, minimizing the deviance
 *   -2 sum_i [y_i eta_i - log(1 + exp(eta_i))],  eta_i = b0 + x_i'b,  y_i in {0, 1},
 * with Newton's method in its iteratively reweighted least squares form (McCullagh & Nelder,
 * "Generalized Linear Models", 2nd ed., section 4.4) and step halving whenever the deviance rises.
 * Standard errors are the square roots of diag of the inverse Fisher information (X'WX)^-1 at the
 * estimate; z statistics and p-values use the standard normal (Wald).
 *
 * Separation (Albert & Anderson 1984): when a combination of predictors classifies rows perfectly,
 * the likelihood keeps rising as coefficients grow and no finite estimate exists. It shows as rows
 * whose fitted probability is numerically 0 or 1 on their observed side; those fits are reported
 * with status 'separation' and no standard errors, never as NaN.
 */

/** |eta| beyond which a fitted probability is within 1e-12 of 0 or 1: log((1 - 1e-12) / 1e-12). */
const SEPARATED_ETA = 27.6;
const MAX_HALVINGS = 40;

export function fitBinomial(design: DesignMatrix, y: Float64Array, options: UnpenalizedOptions = {}): UnpenalizedResult {
  const { n, p, x, terms } = design;
  const maxIterations = options.maxIterations ?? 60;
  const tolerance = options.tolerance ?? 1e-13;

  const ybar = y.reduce((s, v) => s + v, 0) / n;
  // The row kernel (loss, mu - y and the weight mu (1 - mu) from one exp per row) is the one the
  // penalized path's Newton loop uses (core/logisticRows.ts); the steps differ (decision note 0025).
  const residual = new Float64Array(n);
  const deviance = (eta: Float64Array): number => 2 * logisticRows(eta, y, n, residual, null);
  const nullDeviance = deviance(new Float64Array(n).fill(Math.log(ybar / (1 - ybar))));
  let eta: Float64Array = new Float64Array(n).fill(Math.log(ybar / (1 - ybar)));
  let dev = nullDeviance;
  let ls: LeastSquaresFit | null = null;
  let converged = false;
  let iterations = 0;
  const w = new Float64Array(n);
  const z = new Float64Array(n);
  const working = (): void => {
    logisticRows(eta, y, n, residual, w);
    for (let i = 0; i < n; i++) {
      w[i] = Math.max(w[i], 1e-300);
      z[i] = eta[i] - residual[i] / w[i];
    }
  };
  while (iterations < maxIterations && !converged) {
    iterations++;
    working();
    ls = weightedLeastSquares(n, p, x, z, w);
    let next = linearPredictor(design, ls);
    let nextDev = deviance(next);
    // Step halving towards the previous iterate while the deviance rises (or overflows).
    for (let h = 0; h < MAX_HALVINGS && !(nextDev <= dev * (1 + 1e-15)); h++) {
      next = next.map((v, i) => (v + eta[i]) / 2);
      nextDev = deviance(next);
    }
    converged = Math.abs(dev - nextDev) <= tolerance * (Math.abs(nextDev) + 0.1);
    eta = next;
    dev = nextDev;
    if (countSeparated(y, eta) === n) break; // complete separation: every row fitted perfectly
  }
  if (ls === null) throw new Error('binomial fit: no iteration was run');
  // Recompute the estimates and information at the final linear predictor (after any halving).
  working();
  const final = weightedLeastSquares(n, p, x, z, w);
  checkDegreesOfFreedom(n, final.rank + 1);
  const separatedRows = countSeparated(y, eta);
  const aliased = final.aliased.map((j) => terms[j]);
  const status: UnpenalizedStatus =
    separatedRows > 0 ? 'separation' : !converged ? 'iteration-limit' : aliased.length > 0 ? 'rank-deficient' : 'converged';
  const inference = status === 'converged' || status === 'rank-deficient';
  const coefficients = [];
  for (let j = 0; j < p; j++) {
    if (Number.isNaN(final.beta[j])) continue;
    coefficients.push(waldRow(terms[j], final.beta[j], inference ? final.slopeVariance[j] : null, null));
  }
  return {
    family: 'binomial',
    status,
    message: messageFor(status, { iterations, separatedRows, n, aliased, dev }),
    n,
    intercept: waldRow('(intercept)', final.intercept, inference ? final.interceptVariance : null, null),
    coefficients,
    aliased,
    statisticKind: 'z',
    residualDf: n - final.rank - 1,
    residualStandardDeviation: null,
    rSquared: null,
    deviance: dev,
    nullDeviance,
    iterations,
    separatedRows,
    caution: null,
  };
}

function linearPredictor(design: DesignMatrix, ls: LeastSquaresFit): Float64Array {
  const { n, p, x } = design;
  const eta = new Float64Array(n).fill(ls.intercept);
  for (let j = 0; j < p; j++) {
    const b = ls.beta[j];
    if (Number.isNaN(b)) continue;
    for (let i = 0; i < n; i++) eta[i] += x[j * n + i] * b;
  }
  return eta;
}

function countSeparated(y: Float64Array, eta: Float64Array): number {
  let count = 0;
  for (let i = 0; i < y.length; i++) if ((2 * y[i] - 1) * eta[i] > SEPARATED_ETA) count++;
  return count;
}

function messageFor(
  status: UnpenalizedStatus,
  info: { iterations: number; separatedRows: number; n: number; aliased: string[]; dev: number },
): string {
  switch (status) {
    case 'separation':
      return info.separatedRows === info.n
        ? 'Complete separation: the predictors classify every row perfectly, so the maximum-likelihood ' +
            'coefficients are infinite. The estimates shown are where Newton stopped; no standard errors are given. ' +
            'A penalized (lasso or elastic-net) fit gives finite coefficients.'
        : `Quasi-complete separation: ${info.separatedRows} of ${info.n} rows are fitted with probability ` +
            'numerically 0 or 1, so some coefficients grow without bound and have no finite estimate. ' +
            'No standard errors are given; a penalized fit or fewer predictors avoids this.';
    case 'iteration-limit':
      return `Newton/IRLS stopped at the iteration limit (${info.iterations}) before the deviance settled (deviance ${info.dev}).`;
    case 'rank-deficient':
      return aliasedMessage(info.aliased);
    default:
      return `Newton/IRLS converged in ${info.iterations} iterations.`;
  }
}
