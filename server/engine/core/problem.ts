import type { Family } from '../types';
import type { GramCache } from './gram';
import type { LossRole } from './loss';
import type { BlockPenalty } from './penalty';

/**
 * One penalized problem on standardized, centred columns (see standardize.ts):
 *   gaussian: 1/(2n) ||yc - X b||^2 + lambda P(b)   (intercept = mean(y) - centers'b, closed form)
 *   binomial: (1/n) sum [log(1 + exp(eta_i)) - y_i eta_i] + lambda P(b),  eta = b0 + X b
 */
export interface Problem {
  family: Family;
  n: number;
  p: number;
  x: Float64Array;
  /** gaussian: the centred response; binomial: the 0/1 response. */
  y: Float64Array;
  yMean: number;
  /** gaussian: ||yc||^2 and c = X'yc/n. */
  yy: number;
  c: Float64Array;
  gram: GramCache;
  /** The loss role for this family and form (loss/index.ts); set once the problem is built. */
  loss: LossRole;
  penalty: BlockPenalty;
  /** ||x_j||^2 of each (centred, scaled) column, for Gap Safe spheres. */
  colNormSq: Float64Array;
  /** Objective at b = 0 with the best intercept: the gap's scale (the loss's null objective). */
  nullObjective: number;
}

/** Columns of some blocks, laid out block after block; the binomial intercept is slot k. */
export interface WorkingSet {
  blocks: Int32Array;
  blockStart: Int32Array;
  features: Int32Array;
  k: number;
  /** k, plus 1 for the intercept slot (binomial). */
  size: number;
}

export function makeWorkingSet(pen: BlockPenalty, blocks: Int32Array, intercept: boolean): WorkingSet {
  const blockStart = new Int32Array(blocks.length + 1);
  let k = 0;
  for (let b = 0; b < blocks.length; b++) {
    blockStart[b] = k;
    k += pen.start[blocks[b] + 1] - pen.start[blocks[b]];
  }
  blockStart[blocks.length] = k;
  const features = new Int32Array(k);
  for (let b = 0; b < blocks.length; b++) {
    const u = blocks[b];
    for (let i = pen.start[u]; i < pen.start[u + 1]; i++) features[blockStart[b] + i - pen.start[u]] = pen.features[i];
  }
  return { blocks, blockStart, features, k, size: k + (intercept ? 1 : 0) };
}

/** log(1 + exp(z)) without overflow. */
export function softplus(z: number): number {
  return z > 0 ? z + Math.log1p(Math.exp(-z)) : Math.log1p(Math.exp(z));
}

export function sigmoid(z: number): number {
  if (z >= 0) return 1 / (1 + Math.exp(-z));
  const e = Math.exp(z);
  return e / (1 + e);
}
