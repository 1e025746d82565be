import type { Family } from '../types';

/**
 * How an unpenalized fit ended. 'separation': the binomial maximum-likelihood estimates do not
 * exist (some rows are classified perfectly, so coefficients grow without bound); 'rank-deficient':
 * some terms are exact linear combinations of others and were left out (see `aliased`).
 */
export type UnpenalizedStatus =
  | 'converged'
  | 'iteration-limit'
  | 'separation'
  | 'rank-deficient'
  | 'numerical-failure';

/** One estimated coefficient with its Wald inference; null where inference is not available. */
export interface CoefficientRow {
  term: string;
  estimate: number;
  standardError: number | null;
  /** t (gaussian) or z (binomial) statistic: estimate / standardError. */
  statistic: number | null;
  /** Two-sided p-value from the t (gaussian) or standard normal (binomial) distribution. */
  pValue: number | null;
}

export interface UnpenalizedResult {
  family: Family;
  status: UnpenalizedStatus;
  message: string;
  n: number;
  intercept: CoefficientRow;
  /** One row per estimated term, in design order (aliased terms are absent). */
  coefficients: CoefficientRow[];
  /** Terms left out because they are linear combinations of earlier terms (or constant). */
  aliased: string[];
  statisticKind: 't' | 'z';
  /** Residual degrees of freedom: n minus the number of estimated coefficients (with intercept). */
  residualDf: number;
  /** gaussian only: sqrt(RSS / residualDf); null for binomial. */
  residualStandardDeviation: number | null;
  /** gaussian only: 1 - RSS / TSS; null for binomial. */
  rSquared: number | null;
  /** Residual deviance (gaussian: RSS; binomial: -2 log-likelihood) and the intercept-only one. */
  deviance: number;
  nullDeviance: number;
  /** Newton/IRLS iterations (binomial); refinement steps of the QR solve (gaussian). */
  iterations: number;
  /** Binomial: rows whose fitted probability is numerically 0 or 1 on their observed side. */
  separatedRows: number;
  /** Set by refitSelected: inference after selection is optimistic. */
  caution: string | null;
}

export interface UnpenalizedOptions {
  /** Binomial Newton iterations; default 60. */
  maxIterations?: number;
  /** Binomial: relative deviance change for convergence; default 1e-13. */
  tolerance?: number;
}
