import type { SupportMemory } from './loss/role';
import type { SymmetricFactor } from './symmetric';

/**
 * The solution's tangent along the path, kept in the path's memory from one polish to the next: on a fixed
 * support and signs the optimality condition grad L(b) + l1 s + l2 b = 0 (l1, l2 proportional to
 * lambda) gives H db/dlambda = -(l1 s + l2 b) / lambda, with H the Hessian at the solution. The
 * next lambda's Newton then starts from the first-order prediction b + (lambda' - lambda) db/dlambda
 * instead of b (a predictor-corrector path step, Allgower & Georg 1990, "Numerical Continuation
 * Methods", ch. 2), which saves about one Newton step per lambda. Applied only when the start is the
 * recorded solution and the support and signs are unchanged.
 */
export interface Tangent {
  lambda: number;
  features: Int32Array;
  signs: Int8Array;
  solution: Float64Array;
  direction: Float64Array;
}

function sameArrays(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** Moves `beta` (support values, then the intercept) to the prediction for `lambda` when it applies. */
export function predict(memory: SupportMemory, lambda: number, features: Int32Array, signs: Int8Array, beta: Float64Array): void {
  const t = memory.tangent;
  if (!t || !(lambda < t.lambda) || !sameArrays(t.features, features) || !sameArrays(t.signs, signs) || !sameArrays(t.solution, beta)) return;
  const delta = lambda - t.lambda;
  for (let q = 0; q < beta.length; q++) beta[q] += delta * t.direction[q];
}

/**
 * Records the tangent at a Newton solution (factor: the Hessian with the ridge, at the solution or
 * at the point of the last Newton step; a predictor needs no more).
 */
export function recordTangent(
  memory: SupportMemory,
  lambda: number,
  features: Int32Array,
  signs: Int8Array,
  beta: Float64Array,
  factor: SymmetricFactor,
  linear: Float64Array,
  ridge: Float64Array,
): void {
  const m = beta.length;
  if (!(lambda > 0)) return;
  const rhs = new Float64Array(m);
  for (let q = 0; q < m; q++) rhs[q] = -(linear[q] + ridge[q] * beta[q]) / lambda;
  const direction = new Float64Array(m);
  if (!factor.solve(rhs, direction)) return;
  memory.tangent = { lambda, features, signs, solution: Float64Array.from(beta), direction };
}
