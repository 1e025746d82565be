import { proxBlock } from './prox';

/**
 * The penalty role. Lasso, elastic net and group lasso are one family of block penalties:
 *
 *   P(b) = sum_u w_u (alpha ||b_u||_2 + (1 - alpha)/2 ||b_u||_2^2)
 *
 * lasso and elastic net: one block per column, w_u = penalty weight v_j; group lasso: one block per
 * group, w_u = group weight (default sqrt(|g|)), alpha = 1. Blocks with w_u = 0 are unpenalized.
 * Constant columns belong to no block (their coefficient stays 0).
 */
export interface BlockPenalty {
  alpha: number;
  nBlocks: number;
  /** Columns of block u: features[start[u] .. start[u + 1]). */
  start: Int32Array;
  features: Int32Array;
  weight: Float64Array;
}

export function buildBlockPenalty(
  p: number,
  constant: Uint8Array,
  alpha: number,
  groupOfTerm: ArrayLike<number> | null,
  weightOf: (block: number, size: number, members: number[]) => number,
): BlockPenalty {
  const members = new Map<number, number[]>();
  for (let j = 0; j < p; j++) {
    const g = groupOfTerm ? groupOfTerm[j] : j;
    const list = members.get(g) ?? [];
    list.push(j);
    members.set(g, list);
  }
  const ids = [...members.keys()].sort((a, b) => a - b);
  const start: number[] = [0];
  const features: number[] = [];
  const weight: number[] = [];
  for (const id of ids) {
    const all = members.get(id) ?? [];
    const kept = all.filter((j) => !constant[j]);
    if (kept.length === 0) continue;
    features.push(...kept);
    start.push(features.length);
    // The declared group size (constant members included) keeps weights equal across CV folds.
    weight.push(weightOf(id, all.length, all));
  }
  return {
    alpha,
    nBlocks: weight.length,
    start: Int32Array.from(start),
    features: Int32Array.from(features),
    weight: Float64Array.from(weight),
  };
}

/** lambda * P restricted to a vector laid out block after block (positions as in `blockStart`). */
export function penaltyValue(pen: BlockPenalty, blocks: Int32Array, blockStart: Int32Array, w: Float64Array, lambda: number): number {
  let total = 0;
  for (let b = 0; b < blocks.length; b++) {
    const weight = pen.weight[blocks[b]];
    if (weight === 0) continue;
    let sq = 0;
    for (let i = blockStart[b]; i < blockStart[b + 1]; i++) sq += w[i] * w[i];
    total += weight * (pen.alpha * Math.sqrt(sq) + ((1 - pen.alpha) / 2) * sq);
  }
  return lambda * total;
}

/** prox of step * lambda * P on the working vector (block after block), into out. */
export function penaltyProx(
  pen: BlockPenalty,
  blocks: Int32Array,
  blockStart: Int32Array,
  z: Float64Array,
  out: Float64Array,
  stepLambda: number,
): void {
  for (let b = 0; b < blocks.length; b++) {
    const t = stepLambda * pen.weight[blocks[b]];
    const from = blockStart[b];
    const to = blockStart[b + 1];
    if (t === 0) for (let i = from; i < to; i++) out[i] = z[i];
    else proxBlock(z, out, from, to, t, pen.alpha);
  }
}

/**
 * Conjugate of lambda * w (alpha ||.|| + (1 - alpha)/2 ||.||^2) at a block of norm `norm`: with
 * alpha < 1, (norm - lambda w alpha)_+^2 / (2 lambda w (1 - alpha)); with alpha = 1 the indicator of
 * norm <= lambda w (the dual point is made feasible before this is called, so it is 0).
 */
export function blockConjugate(norm: number, lambda: number, weight: number, alpha: number): number {
  if (alpha >= 1) return 0;
  const excess = norm - lambda * weight * alpha;
  return excess > 0 ? (excess * excess) / (2 * lambda * weight * (1 - alpha)) : 0;
}

/** ||v_u||_2 for a column-indexed vector. */
export function blockNorm(pen: BlockPenalty, u: number, v: Float64Array): number {
  let sq = 0;
  for (let i = pen.start[u]; i < pen.start[u + 1]; i++) sq += v[pen.features[i]] * v[pen.features[i]];
  return Math.sqrt(sq);
}

/** lambda_max = max over penalized blocks of ||grad_u|| / (w_u alpha), grad at the null model. */
export function penaltyLambdaMax(pen: BlockPenalty, gradAtNull: Float64Array): number {
  let max = 0;
  for (let u = 0; u < pen.nBlocks; u++) {
    if (pen.weight[u] === 0) continue;
    max = Math.max(max, blockNorm(pen, u, gradAtNull) / (pen.weight[u] * pen.alpha));
  }
  return max;
}
