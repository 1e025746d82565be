import { FREE, type SupportMemory } from './loss';
import type { Problem, WorkingSet } from './problem';

/** A coefficient off the support may exceed its KKT bound by this relative slack (rounding). */
const KKT_SLACK = 1e-9;
const MAX_ROUNDS = 12;

/**
 * Active-set polish (common practice; the "active-set Newton refinement" that several lasso and
 * elastic-net solvers run once the first-order method has found the support). FISTA finds the
 * support and signs quickly but approaches the point itself only linearly, and a duality gap of
 * 1e-10 bounds the coefficients no better than sqrt(2 gap / mu) when columns are nearly collinear.
 * On a fixed support A with signs s the objective is smooth:
 *   gaussian: 1/(2n)||yc - X_A b_A||^2 + sum_A lambda v_j (alpha s_j b_j + (1 - alpha)/2 b_j^2),
 *   whose minimizer solves (X_A'X_A/n + lambda (1 - alpha) V_A) b_A = X_A'yc/n - lambda alpha V_A s
 *   exactly (Cholesky of the small system, intercept by centring);
 *   binomial: the same with the logistic loss and the intercept, minimized by Newton's method.
 * The loss role (loss/*.ts, solveOnSupport) solves it; `memory` is the path's (factor, tangent).
 * The result is the exact solution of the (working-set) problem when every sign is kept and every
 * column off the support satisfies the KKT condition |x_j'theta| <= lambda alpha v_j. Otherwise the
 * flipped columns leave A, the violating ones join it with the sign of their gradient, and the system
 * is solved again (a primal active-set method), for at most MAX_ROUNDS rounds.
 * Only for penalties whose blocks are single columns (lasso, elastic net). The caller recomputes the
 * duality gap at the polished point and keeps it only if it is no worse: the gap stays the
 * certificate. Writes the working vector (intercept in slot k for binomial) into `out`. `tolerance`
 * is the relative gap the solve asks for (the support solve may spend less accuracy on a loose one).
 */
export function polishOnSupport(
  problem: Problem,
  ws: WorkingSet,
  lambda: number,
  w: Float64Array,
  out: Float64Array,
  maxSteps: number,
  memory: SupportMemory,
  tolerance?: number,
): { ok: boolean; steps: number } {
  const k = ws.k;
  const pen = problem.penalty;
  const l1 = new Float64Array(k);
  const l2 = new Float64Array(k);
  const sign = new Int8Array(k);
  for (let b = 0; b < k; b++) {
    const v = pen.weight[ws.blocks[b]];
    l1[b] = lambda * pen.alpha * v;
    l2[b] = lambda * (1 - pen.alpha) * v;
    sign[b] = v === 0 || lambda === 0 ? FREE : Math.sign(w[b]);
  }
  out.set(w);
  let steps = 0;
  for (let round = 0; round < MAX_ROUNDS; round++) {
    const active: number[] = [];
    for (let b = 0; b < k; b++) if (sign[b] !== 0) active.push(b);
    const budget = maxSteps - steps;
    if (budget <= 0) return { ok: false, steps };
    const solved = problem.loss.solveOnSupport({ ws, active, sign, l1, l2, lambda, tolerance }, out, budget, memory);
    steps += solved.steps;
    if (!solved.ok) return { ok: false, steps };
    let flipped = false;
    for (const a of active) {
      if (sign[a] !== FREE && !(out[a] * sign[a] > 0)) {
        sign[a] = 0;
        out[a] = 0;
        flipped = true;
      }
    }
    if (flipped) continue;
    const g = problem.loss.negativeGradient(ws, active, out, memory);
    let added = false;
    for (let b = 0; b < k; b++) {
      if (sign[b] === 0 && Math.abs(g[b]) > l1[b] * (1 + KKT_SLACK)) {
        sign[b] = g[b] > 0 ? 1 : -1;
        added = true;
      }
    }
    if (!added) return { ok: true, steps };
  }
  return { ok: false, steps };
}
