import { FREE, newtonOnSupport } from './polishNewton';
import { sigmoid, type Problem, type WorkingSet } from './problem';
import { SupportSystem } from './supportSystem';

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
 * The result is the exact solution of the (working-set) problem when every sign is kept and every
 * column off the support satisfies the KKT condition |x_j'theta| <= lambda alpha v_j. Otherwise the
 * flipped columns leave A, the violating ones join it with the sign of their gradient, and the system
 * is solved again (a primal active-set method), for at most MAX_ROUNDS rounds.
 * Only for penalties whose blocks are single columns (lasso, elastic net). The caller recomputes the
 * duality gap at the polished point and keeps it only if it is no worse: the gap stays the
 * certificate. Writes the working vector (intercept in slot k for binomial) into `out`.
 */
export function polishOnSupport(
  problem: Problem,
  ws: WorkingSet,
  lambda: number,
  w: Float64Array,
  out: Float64Array,
  maxSteps: number,
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
    let used = 1;
    if (problem.family === 'gaussian') {
      if (!gaussianOnSupport(problem, ws, active, sign, l1, l2, out)) return { ok: false, steps: steps + 1 };
    } else {
      const newton = newtonOnSupport(problem, ws, active, sign, l1, l2, out, budget, lambda);
      if (!newton.ok) return { ok: false, steps: steps + newton.steps };
      used = newton.steps;
    }
    steps += used;
    let flipped = false;
    for (const a of active) {
      if (sign[a] !== FREE && !(out[a] * sign[a] > 0)) {
        sign[a] = 0;
        out[a] = 0;
        flipped = true;
      }
    }
    if (flipped) continue;
    const g = negativeGradient(problem, ws, active, out);
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

/** One factorized support system per problem, carried from polish to polish along the path. */
const systems = new WeakMap<Problem, SupportSystem>();

function systemOf(problem: Problem): SupportSystem {
  let system = systems.get(problem);
  if (!system) {
    const { n, x } = problem;
    // Gram form: the cached G; design form: the dot product of the two columns (same sum order).
    system = new SupportSystem(
      problem.useGram
        ? (f, g) => problem.gram.column(f)[g]
        : (f, g) => {
            let s = 0;
            const a = f * n;
            const b = g * n;
            for (let i = 0; i < n; i++) s += x[a + i] * x[b + i];
            return s / n;
          },
    );
    systems.set(problem, system);
  }
  return system;
}

function gaussianOnSupport(
  problem: Problem,
  ws: WorkingSet,
  active: number[],
  sign: Int8Array,
  l1: Float64Array,
  l2: Float64Array,
  out: Float64Array,
): boolean {
  const m = active.length;
  const features = active.map((a) => ws.features[a]);
  const shifts = active.map((a) => l2[a]);
  const rhs = new Float64Array(m);
  for (let q = 0; q < m; q++) {
    const s = sign[active[q]];
    rhs[q] = problem.c[features[q]] - (s === FREE ? 0 : l1[active[q]] * s);
  }
  const solution = new Float64Array(m);
  if (!systemOf(problem).solve(features, shifts, rhs, solution)) return false;
  out.fill(0, 0, ws.k);
  for (let q = 0; q < m; q++) out[active[q]] = solution[q];
  return true;
}

/** x_j'theta = -gradient of the loss for every working column, at `w` with support `active`. */
function negativeGradient(problem: Problem, ws: WorkingSet, active: number[], w: Float64Array): Float64Array {
  const k = ws.k;
  const g = new Float64Array(k);
  if (problem.family === 'gaussian' && problem.useGram) {
    for (let b = 0; b < k; b++) g[b] = problem.c[ws.features[b]];
    for (const a of active) {
      const coef = w[a];
      if (coef === 0) continue;
      const col = problem.gram.column(ws.features[a]);
      for (let b = 0; b < k; b++) g[b] -= col[ws.features[b]] * coef;
    }
    return g;
  }
  const { n, x, y } = problem;
  const gaussian = problem.family === 'gaussian';
  const eta = new Float64Array(n).fill(gaussian ? 0 : w[k]);
  for (const a of active) {
    const coef = w[a];
    if (coef === 0) continue;
    const off = ws.features[a] * n;
    for (let i = 0; i < n; i++) eta[i] += coef * x[off + i];
  }
  for (let i = 0; i < n; i++) eta[i] = y[i] - (gaussian ? eta[i] : sigmoid(eta[i]));
  for (let b = 0; b < k; b++) {
    const off = ws.features[b] * n;
    let s = 0;
    for (let i = 0; i < n; i++) s += x[off + i] * eta[i];
    g[b] = s / n;
  }
  return g;
}
