import type { SparseTerms } from '@shared/fits';

export interface PathPoint {
  /** Lambda index on the path. */
  i: number;
  x: number;
  y: number;
}

/** The largest |coefficient| each term reaches along the path (one pass over the sparse vectors). */
export function peakSizes(coefficients: SparseTerms[], termCount: number): Float64Array {
  const peak = new Float64Array(termCount);
  for (const c of coefficients) {
    for (let k = 0; k < c.terms.length; k++) {
      const a = Math.abs(c.values[k]);
      if (a > peak[c.terms[k]]) peak[c.terms[k]] = a;
    }
  }
  return peak;
}

/** Indices of the k terms with the largest peak size, largest first; terms never nonzero are left out. */
export function topTerms(peak: Float64Array, k: number): number[] {
  const order = Array.from(peak.keys()).filter((j) => peak[j] > 0);
  order.sort((a, b) => peak[b] - peak[a] || a - b);
  return order.slice(0, k);
}

/** The size of the coefficient vector at each lambda: sum of |b_j| (the L1 norm). */
export function l1Norms(coefficients: SparseTerms[]): number[] {
  return coefficients.map((c) => c.values.reduce((s, v) => s + Math.abs(v), 0));
}

/**
 * One term's coefficient at every lambda (zeros where the sparse vector leaves it out), in increasing
 * x: the chart finds the point nearest the pointer by bisection, which needs sorted x.
 */
export function termPath(coefficients: SparseTerms[], term: number, xs: number[]): PathPoint[] {
  return coefficients
    .map((c, i) => {
      const k = c.terms.indexOf(term);
      return { i, x: xs[i], y: k < 0 ? 0 : c.values[k] };
    })
    .sort((a, b) => a.x - b.x || a.i - b.i);
}
