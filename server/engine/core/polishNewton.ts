import type { Problem, WorkingSet } from './problem';
import { sigmoid, softplus } from './problem';
import { solveSymmetric } from './symmetric';

/** Sign code of a coefficient without sign constraint (unpenalized, or lambda = 0). */
export const FREE = 2;
const MAX_NEWTON = 50;


/**
 * Binomial part of the active-set polish (polish.ts): Newton's method with step halving on the
 * smooth function of (b_A, b0) that equals the objective while the signs s hold:
 *   (1/n) sum [log(1 + exp(eta_i)) - y_i eta_i] + sum_A (l1_j s_j b_j + l2_j/2 b_j^2),
 * eta = b0 + X_A b_A, l1 = lambda alpha v, l2 = lambda (1 - alpha) v (0 for free columns).
 * Starts from `out` (slot k holds the intercept) and writes the minimizer there; zero off A.
 * Stops when a step no longer lowers the function or moves every variable by < 1e-13 (relative).
 * Returns the Newton steps taken and ok = false on failure or when maxSteps do not suffice.
 */
export function newtonOnSupport(
  problem: Problem,
  ws: WorkingSet,
  active: number[],
  sign: Int8Array,
  l1: Float64Array,
  l2: Float64Array,
  out: Float64Array,
  maxSteps: number,
): { ok: boolean; steps: number } {
  const { n, x, y } = problem;
  const k = ws.k;
  const m = active.length + 1;
  const offsets = active.map((a) => ws.features[a] * n);
  const beta = new Float64Array(m);
  for (let q = 0; q < m - 1; q++) beta[q] = out[active[q]];
  beta[m - 1] = out[k];
  const linear = new Float64Array(m);
  const ridge = new Float64Array(m);
  for (let q = 0; q < m - 1; q++) {
    const s = sign[active[q]];
    linear[q] = s === FREE ? 0 : l1[active[q]] * s;
    ridge[q] = l2[active[q]];
  }
  const etaOf = (v: Float64Array, eta: Float64Array): void => {
    eta.fill(v[m - 1]);
    for (let q = 0; q < m - 1; q++) {
      const coef = v[q];
      if (coef === 0) continue;
      const off = offsets[q];
      for (let i = 0; i < n; i++) eta[i] += coef * x[off + i];
    }
  };
  const valueOf = (v: Float64Array, eta: Float64Array): number => {
    let s = 0;
    for (let i = 0; i < n; i++) s += softplus(eta[i]) - y[i] * eta[i];
    s /= n;
    for (let q = 0; q < m - 1; q++) s += v[q] * (linear[q] + 0.5 * ridge[q] * v[q]);
    return s;
  };
  let eta = new Float64Array(n);
  let trialEta = new Float64Array(n);
  etaOf(beta, eta);
  let value = valueOf(beta, eta);
  const residual = new Float64Array(n);
  const weight = new Float64Array(n);
  const weighted = new Float64Array(n);
  const grad = new Float64Array(m);
  const hess = new Float64Array(m * m);
  const step = new Float64Array(m);
  const trial = new Float64Array(m);
  const column = (q: number, i: number): number => (q === m - 1 ? 1 : x[offsets[q] + i]);
  let steps = 0;
  let done = false;
  for (let it = 0; it < MAX_NEWTON && steps < maxSteps; it++) {
    steps++;
    for (let i = 0; i < n; i++) {
      const mu = sigmoid(eta[i]);
      residual[i] = mu - y[i];
      weight[i] = mu * (1 - mu);
    }
    for (let q = 0; q < m; q++) {
      let g = 0;
      for (let i = 0; i < n; i++) {
        const xq = column(q, i);
        g += residual[i] * xq;
        weighted[i] = weight[i] * xq;
      }
      grad[q] = g / n + linear[q] + ridge[q] * beta[q];
      for (let r = 0; r <= q; r++) {
        let h = 0;
        for (let i = 0; i < n; i++) h += weighted[i] * column(r, i);
        hess[q * m + r] = h / n;
        hess[r * m + q] = h / n;
      }
      hess[q * m + q] += ridge[q];
    }
    if (!solveSymmetric(hess, m, grad, step)) return { ok: false, steps };
    let scale = 1;
    let accepted = false;
    for (let half = 0; half < 40; half++, scale /= 2) {
      for (let q = 0; q < m; q++) trial[q] = beta[q] - scale * step[q];
      etaOf(trial, trialEta);
      const candidate = valueOf(trial, trialEta);
      if (candidate <= value) {
        value = candidate;
        accepted = true;
        break;
      }
    }
    if (!accepted) {
      done = true;
      break;
    }
    let moved = false;
    for (let q = 0; q < m; q++) if (Math.abs(trial[q] - beta[q]) > 1e-13 * Math.max(1, Math.abs(beta[q]))) moved = true;
    beta.set(trial);
    [eta, trialEta] = [trialEta, eta];
    if (!moved) {
      done = true;
      break;
    }
  }
  if (!done || !Number.isFinite(value)) return { ok: false, steps };
  out.fill(0, 0, k);
  for (let q = 0; q < m - 1; q++) out[active[q]] = beta[q];
  out[k] = beta[m - 1];
  return { ok: true, steps };
}
