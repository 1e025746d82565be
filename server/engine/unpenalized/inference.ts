// The two distribution functions alone, not their packages' namespaces (every density, quantile and
// moment: about half the CLI bundle, parsed at every start).
import normalCdf from '@stdlib/stats-base-dists-normal-cdf';
import studentTCdf from '@stdlib/stats-base-dists-t-cdf';
import type { CoefficientRow } from './types';

/**
 * Wald inference for one coefficient: statistic = estimate / SE, two-sided p-value from the
 * t distribution with `df` degrees of freedom (gaussian) or the standard normal (binomial, df null).
 * The lower tail is used (2 F(-|s|)) so tiny p-values keep their digits instead of rounding 1 - F to 0.
 */
export function waldRow(term: string, estimate: number, variance: number | null, df: number | null): CoefficientRow {
  if (variance === null || !(variance >= 0) || !Number.isFinite(variance)) {
    return { term, estimate, standardError: null, statistic: null, pValue: null };
  }
  const standardError = Math.sqrt(variance);
  // A perfect fit (zero residual variance) has no finite statistic; report the SE alone.
  if (standardError === 0) return { term, estimate, standardError, statistic: null, pValue: null };
  const statistic = estimate / standardError;
  const tail = df === null ? normalCdf(-Math.abs(statistic), 0, 1) : studentTCdf(-Math.abs(statistic), df);
  return { term, estimate, standardError, statistic, pValue: Math.min(1, 2 * tail) };
}
