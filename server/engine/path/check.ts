import type { DualContext, DualResult } from '../core/dual';
import { penaltyValue } from '../core/penalty';
import type { Problem } from '../core/problem';
import { sigmoid, softplus } from '../core/problem';

export interface FullCheck {
  /** Relative duality gap of the full problem. */
  gap: number;
  absoluteGap: number;
  /** X'theta_raw = -gradient of the loss, column-indexed (for KKT checks and strong rules). */
  g: Float64Array;
  loss: number;
  dual: DualResult;
}

/**
 * Loss, gradient and duality gap of the full problem at (coef, intercept): one product with all of
 * X (or, for the Gram form, with the Gram columns of the non-zero coefficients).
 */
export function checkFull(
  problem: Problem,
  dual: DualContext,
  allBlocks: Int32Array,
  allStart: Int32Array,
  coef: Float64Array,
  intercept: number,
  lambda: number,
): FullCheck {
  const { n, p, x, y } = problem;
  const g = new Float64Array(p);
  let loss = 0;
  let ycTheta = 0;
  let theta: Float64Array | null = null;
  if (problem.family === 'gaussian' && problem.useGram) {
    g.set(problem.c);
    let cb = 0;
    for (let k = 0; k < p; k++) {
      const beta = coef[k];
      if (beta === 0) continue;
      cb += problem.c[k] * beta;
      const col = problem.gram.column(k);
      for (let j = 0; j < p; j++) g[j] -= col[j] * beta;
    }
    // b'Gb = b'(c - g)
    let bGb = 0;
    for (let k = 0; k < p; k++) if (coef[k] !== 0) bGb += coef[k] * (problem.c[k] - g[k]);
    loss = problem.yy / (2 * n) - cb + 0.5 * bGb;
    ycTheta = problem.yy / n - cb;
  } else {
    const eta = new Float64Array(n).fill(problem.family === 'binomial' ? intercept : 0);
    for (let k = 0; k < p; k++) {
      const beta = coef[k];
      if (beta === 0) continue;
      const off = k * n;
      for (let i = 0; i < n; i++) eta[i] += beta * x[off + i];
    }
    theta = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      if (problem.family === 'gaussian') {
        const r = y[i] - eta[i];
        loss += r * r;
        ycTheta += (y[i] * r) / n;
        theta[i] = r / n;
      } else {
        loss += softplus(eta[i]) - y[i] * eta[i];
        theta[i] = (y[i] - sigmoid(eta[i])) / n;
      }
    }
    loss /= problem.family === 'gaussian' ? 2 * n : n;
    transposeTimes(x, n, p, theta, g);
  }
  const packed = new Float64Array(problem.penalty.features.length);
  for (let i = 0; i < packed.length; i++) packed[i] = coef[problem.penalty.features[i]];
  const penalty = penaltyValue(problem.penalty, allBlocks, allStart, packed, lambda);
  const result = dual.gap({ lambda, blocks: allBlocks, g, loss, penalty, ycTheta, theta: problem.family === 'binomial' ? theta : null });
  return { gap: result.gap / problem.nullObjective, absoluteGap: result.gap, g, loss, dual: result };
}

/**
 * g = X'v, four columns per pass over v (fewer loads per product); each entry is the same
 * left-to-right sum over rows as a plain dot product.
 */
function transposeTimes(x: Float64Array, n: number, p: number, v: Float64Array, g: Float64Array): void {
  let j = 0;
  for (; j + 4 <= p; j += 4) {
    const a0 = j * n;
    const a1 = a0 + n;
    const a2 = a1 + n;
    const a3 = a2 + n;
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (let i = 0; i < n; i++) {
      const t = v[i];
      s0 += x[a0 + i] * t;
      s1 += x[a1 + i] * t;
      s2 += x[a2 + i] * t;
      s3 += x[a3 + i] * t;
    }
    g[j] = s0;
    g[j + 1] = s1;
    g[j + 2] = s2;
    g[j + 3] = s3;
  }
  for (; j < p; j++) {
    const off = j * n;
    let s = 0;
    for (let i = 0; i < n; i++) s += x[off + i] * v[i];
    g[j] = s;
  }
}
