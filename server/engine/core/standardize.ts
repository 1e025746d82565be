import { EngineInputError, type DesignMatrix } from '../types';

export interface StandardizedDesign {
  n: number;
  p: number;
  /** Column-major, every column centred; divided by its population sd when standardizing. */
  x: Float64Array;
  centers: Float64Array;
  /** Population sd (1/n) when standardizing, else 1; 0 marks a constant column (left out). */
  scales: Float64Array;
  constant: Uint8Array;
}

/**
 * Centres every column on the rows given and, when `standardize`, divides it by its population
 * standard deviation, so the penalty applies to standardized coefficients (docs/engine.md, "Standardization"). Centring is
 * done either way: it makes the gaussian intercept closed-form and the fit better conditioned, and
 * does not change the penalized coefficients. A column with equal values everywhere is constant:
 * its coefficient stays 0. With `overwrite` the result is written over design.x (the caller's own
 * copy, e.g. a fold's training rows: one n x p copy fewer per fold); same numbers either way.
 */
export function standardizeDesign(design: DesignMatrix, standardize: boolean, overwrite = false): StandardizedDesign {
  const { n, p } = design;
  const x = overwrite ? design.x : new Float64Array(n * p);
  const centers = new Float64Array(p);
  const scales = new Float64Array(p);
  const constant = new Uint8Array(p);
  for (let j = 0; j < p; j++) {
    const off = j * n;
    let sum = 0;
    let min = Infinity;
    let max = -Infinity;
    for (let i = 0; i < n; i++) {
      const v = design.x[off + i];
      sum += v;
      if (v < min) min = v;
      if (v > max) max = v;
    }
    const mean = sum / n;
    centers[j] = mean;
    if (min === max) {
      constant[j] = 1;
      scales[j] = 0;
      if (overwrite) x.fill(0, off, off + n);
      continue;
    }
    let ss = 0;
    for (let i = 0; i < n; i++) {
      const d = design.x[off + i] - mean;
      x[off + i] = d;
      ss += d * d;
    }
    const sd = Math.sqrt(ss / n);
    if (!Number.isFinite(sd) || !Number.isFinite(mean)) {
      throw new EngineInputError(`column "${design.terms[j]}" has values too large to fit (their squares overflow); rescale it`, design.terms[j]);
    }
    scales[j] = standardize ? sd : 1;
    if (standardize) {
      const inv = 1 / sd;
      for (let i = 0; i < n; i++) x[off + i] *= inv;
    }
  }
  return { n, p, x, centers, scales, constant };
}

/** Columns whose values are all equal over `rows` (default: every row); standardizeDesign's test. */
export function constantColumns(design: DesignMatrix, rows?: ArrayLike<number>): Uint8Array {
  const { n, p, x } = design;
  const count = rows ? rows.length : n;
  const row = (t: number): number => (rows ? rows[t] : t);
  const constant = new Uint8Array(p);
  for (let j = 0; j < p; j++) {
    const off = j * n;
    const first = x[off + row(0)];
    let same = 1;
    for (let t = 1; t < count; t++) {
      if (x[off + row(t)] !== first) {
        same = 0;
        break;
      }
    }
    constant[j] = same;
  }
  return constant;
}
