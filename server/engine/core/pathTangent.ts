import type { SupportMemory } from './loss/role';
import type { SymmetricFactor } from './symmetric';

/**
 * The solution's tangent along the path, kept in the path's memory from one polish to the next: on a fixed
 * support and signs the optimality condition grad L(b) + l1 s + l2 b = 0 (l1, l2 proportional to
 * lambda) gives H db/dlambda = -(l1 s + l2 b) / lambda, with H the Hessian at the solution. The
 * next lambda's Newton then starts from the prediction b + d db/dlambda + d^2/2 c (d = lambda' -
 * lambda; c = the change of db/dlambda since the previous lambda per unit lambda, when that solve
 * had the same support and signs) instead of b: a predictor-corrector path step with a second-order
 * predictor (Allgower & Georg 1990, "Numerical Continuation Methods", ch. 2 and 6). The first-order
 * term saves about one Newton step per lambda; the quadratic one, on the breast cancer path, about
 * one chord step in nine. Applied only when the start is the recorded solution and the support and
 * signs are unchanged.
 */
export interface Tangent {
  lambda: number;
  features: Int32Array;
  signs: Int8Array;
  solution: Float64Array;
  direction: Float64Array;
  /**
   * (direction - the previous solve's direction) / (lambda - its lambda) when the support and signs
   * were the same there: a difference quotient of the second derivative, for the quadratic term.
   */
  change: Float64Array | null;
}

function sameArrays(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/**
 * Moves `beta` (support values, then the intercept) to the prediction for `lambda` when it applies;
 * says whether it did.
 */
export function predict(memory: SupportMemory, lambda: number, features: Int32Array, signs: Int8Array, beta: Float64Array): boolean {
  const t = memory.tangent;
  if (!t || !(lambda < t.lambda) || !sameArrays(t.features, features) || !sameArrays(t.signs, signs) || !sameArrays(t.solution, beta)) return false;
  const delta = lambda - t.lambda;
  const change = t.change;
  for (let q = 0; q < beta.length; q++) beta[q] += delta * t.direction[q] + (change ? 0.5 * delta * delta * change[q] : 0);
  return true;
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
  const old = memory.tangent;
  let change: Float64Array | null = null;
  if (old && old.lambda > lambda && sameArrays(old.features, features) && sameArrays(old.signs, signs)) {
    change = new Float64Array(m);
    for (let q = 0; q < m; q++) change[q] = (direction[q] - old.direction[q]) / (lambda - old.lambda);
  }
  memory.tangent = { lambda, features, signs, solution: Float64Array.from(beta), direction, change };
}
