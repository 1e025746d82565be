import { createRng } from '../../../server/engine/random';
import type { DesignMatrix } from '../../../server/engine/types';

/** Seeded gaussian design, column-major, with named terms x1..xp. */
export function randomDesign(n: number, p: number, seed: number): DesignMatrix {
  const rng = createRng(seed);
  const x = new Float64Array(n * p);
  for (let k = 0; k < n * p; k++) x[k] = rng.normal();
  return { n, p, x, terms: Array.from({ length: p }, (_, j) => `x${j + 1}`) };
}

/**
 * Columns centred, mutually orthogonal and scaled to ||x_j||^2 = n, so X'X/n = I and the population
 * sd of every column is 1 (standardization leaves it unchanged). Modified Gram-Schmidt against the
 * constant vector and the previous columns.
 */
export function orthonormalDesign(n: number, p: number, seed: number): DesignMatrix {
  const design = randomDesign(n, p, seed);
  const { x } = design;
  for (let j = 0; j < p; j++) {
    const col = x.subarray(j * n, (j + 1) * n);
    for (let pass = 0; pass < 2; pass++) {
      let mean = 0;
      for (let i = 0; i < n; i++) mean += col[i];
      mean /= n;
      for (let i = 0; i < n; i++) col[i] -= mean;
      for (let k = 0; k < j; k++) {
        const prev = x.subarray(k * n, (k + 1) * n);
        let dot = 0;
        for (let i = 0; i < n; i++) dot += col[i] * prev[i];
        for (let i = 0; i < n; i++) col[i] -= (dot / n) * prev[i];
      }
    }
    let sq = 0;
    for (let i = 0; i < n; i++) sq += col[i] * col[i];
    const scale = Math.sqrt(n / sq);
    for (let i = 0; i < n; i++) col[i] *= scale;
  }
  return design;
}

/** y = X beta + noise * N(0, 1) + 3 (an intercept), seeded. */
export function linearResponse(design: DesignMatrix, beta: number[], noise: number, seed: number): Float64Array {
  const rng = createRng(seed);
  const y = new Float64Array(design.n);
  for (let i = 0; i < design.n; i++) {
    let s = 3;
    for (let j = 0; j < beta.length; j++) s += design.x[j * design.n + i] * beta[j];
    y[i] = s + noise * rng.normal();
  }
  return y;
}

/** Bernoulli draws with P(y = 1) = sigmoid(X beta - 0.3), seeded. */
export function logisticResponse(design: DesignMatrix, beta: number[], seed: number): Float64Array {
  const rng = createRng(seed);
  const y = new Float64Array(design.n);
  for (let i = 0; i < design.n; i++) {
    let s = -0.3;
    for (let j = 0; j < beta.length; j++) s += design.x[j * design.n + i] * beta[j];
    y[i] = rng.next() < 1 / (1 + Math.exp(-s)) ? 1 : 0;
  }
  return y;
}
