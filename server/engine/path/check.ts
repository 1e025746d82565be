import type { DualContext, DualResult } from '../core/dual';
import { penaltyValue } from '../core/penalty';
import type { Problem } from '../core/problem';

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
 * Loss, gradient and duality gap of the full problem at (coef, intercept): the loss evaluates
 * (design form: one product with all of X; Gram form: with the Gram columns of the non-zero
 * coefficients), the dual context builds the dual point.
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
  const { loss, g, residual } = problem.loss.evaluate(coef, intercept);
  const packed = new Float64Array(problem.penalty.features.length);
  for (let i = 0; i < packed.length; i++) packed[i] = coef[problem.penalty.features[i]];
  const penalty = penaltyValue(problem.penalty, allBlocks, allStart, packed, lambda);
  const result = dual.gap({ lambda, blocks: allBlocks, g, loss, penalty, residual });
  return { gap: result.gap / problem.nullObjective, absoluteGap: result.gap, g, loss, dual: result };
}
