import { FREE, type SupportMemory, type SupportProblem } from './loss/role';
import type { Problem } from './problem';
import { softplus } from './problem';
import { predict, recordTangent } from './pathTangent';
import { solveSymmetric } from './symmetric';
const MAX_NEWTON = 50;
/**
 * A Newton step whose predicted decrease (half the Newton decrement, Boyd & Vandenberghe 2004,
 * 9.5.1) is below this fraction of the function value is at the rounding level of the value: the
 * comparison with the old value can no longer tell better from worse, so the full step is taken
 * (quadratic convergence makes it the most accurate point) and Newton stops.
 */
const ROUNDING = 1e-15;
/** After a full step with a decrement this small the next one would be below rounding (quadratic convergence). */
const FINAL = 1e-10;

/**
 * The one logistic Newton loop, used by the binomial active-set polish (polish.ts) and the binomial
 * null fit (loss/binomial.ts: every sign free, no penalty): Newton's method with step halving on the
 * smooth function of (b_A, b0) that equals the objective while the signs s hold:
 *   (1/n) sum [log(1 + exp(eta_i)) - y_i eta_i] + sum_A (l1_j s_j b_j + l2_j/2 b_j^2),
 * eta = b0 + X_A b_A, l1 = lambda alpha v, l2 = lambda (1 - alpha) v (0 for free columns).
 * Starts from `out` (slot k holds the intercept) and writes the minimizer there; zero off A.
 * Stops when a step moves every variable by < 1e-13 (relative) or its predicted decrease is at the
 * rounding level of the value (ROUNDING). The active columns are copied side by side once, so the
 * Hessian X_A'WX_A/n is formed by plain loops over contiguous rows.
 * Returns the Newton steps taken and ok = false on failure or when maxSteps do not suffice.
 */
export function newtonOnSupport(
  problem: Problem,
  support: SupportProblem,
  out: Float64Array,
  maxSteps: number,
  memory: SupportMemory,
): { ok: boolean; steps: number } {
  const { ws, active, sign, l1, l2, lambda } = support;
  const { n, y } = problem;
  const k = ws.k;
  const m = active.length + 1;
  const xa = new Float64Array((m - 1) * n);
  for (let q = 0; q < m - 1; q++) xa.set(problem.x.subarray(ws.features[active[q]] * n, (ws.features[active[q]] + 1) * n), q * n);
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
  const features = Int32Array.from(active, (a) => ws.features[a]);
  const signs = Int8Array.from(active, (a) => sign[a]);
  predict(memory, lambda, features, signs, beta);
  const etaOf = (v: Float64Array, eta: Float64Array): void => {
    eta.fill(v[m - 1]);
    for (let q = 0; q < m - 1; q++) {
      const coef = v[q];
      if (coef === 0) continue;
      const off = q * n;
      for (let i = 0; i < n; i++) eta[i] += coef * xa[off + i];
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
  const weighted = new Float64Array(m * n);
  const grad = new Float64Array(m);
  const hess = new Float64Array(m * m);
  const step = new Float64Array(m);
  const trial = new Float64Array(m);
  let steps = 0;
  let done = false;
  for (let it = 0; it < MAX_NEWTON && steps < maxSteps; it++) {
    steps++;
    hessianAndGradient(xa, n, m, eta, y, residual, weighted, hess, grad);
    for (let q = 0; q < m; q++) {
      grad[q] += linear[q] + ridge[q] * beta[q];
      hess[q * m + q] += ridge[q];
    }
    if (!solveSymmetric(hess, m, grad, step)) return { ok: false, steps };
    let decrement = 0;
    for (let q = 0; q < m; q++) decrement += grad[q] * step[q];
    const atRounding = decrement / 2 <= ROUNDING * Math.max(1, Math.abs(value));
    let scale = 1;
    let accepted = false;
    for (let half = 0; half < 40; half++, scale /= 2) {
      for (let q = 0; q < m; q++) trial[q] = beta[q] - scale * step[q];
      etaOf(trial, trialEta);
      const candidate = valueOf(trial, trialEta);
      if (candidate <= value || (atRounding && Number.isFinite(candidate))) {
        value = Math.min(value, candidate);
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
    const final = scale === 1 && decrement <= FINAL * Math.max(1, Math.abs(value));
    if (!moved || atRounding || final) {
      done = true;
      break;
    }
  }
  if (!done || !Number.isFinite(value)) return { ok: false, steps };
  recordTangent(memory, lambda, features, signs, beta, hess, linear, ridge);
  out.fill(0, 0, k);
  for (let q = 0; q < m - 1; q++) out[active[q]] = beta[q];
  out[k] = beta[m - 1];
  return { ok: true, steps };
}

/**
 * Gradient and Hessian of the mean logistic loss in (b_A, b0) at eta: grad = [X_A 1]'(mu - y)/n,
 * hess = [X_A 1]'W[X_A 1]/n with W = diag(mu (1 - mu)); the intercept is the last slot. The
 * slopes' block is summed two columns by two per pass over the rows (4 sums from 4 loads).
 */
function hessianAndGradient(
  xa: Float64Array,
  n: number,
  m: number,
  eta: Float64Array,
  y: Float64Array,
  residual: Float64Array,
  weighted: Float64Array,
  hess: Float64Array,
  grad: Float64Array,
): void {
  let sumR = 0;
  let sumW = 0;
  const last = m - 1;
  const weight = weighted.subarray(last * n);
  for (let i = 0; i < n; i++) {
    const e = Math.exp(-Math.abs(eta[i]));
    const mu = eta[i] >= 0 ? 1 / (1 + e) : e / (1 + e);
    residual[i] = mu - y[i];
    weight[i] = e / ((1 + e) * (1 + e));
    sumR += residual[i];
    sumW += weight[i];
  }
  for (let q = 0; q < last; q++) {
    const off = q * n;
    let g = 0;
    let h0 = 0;
    for (let i = 0; i < n; i++) {
      const xq = xa[off + i];
      g += residual[i] * xq;
      const wx = weight[i] * xq;
      weighted[off + i] = wx;
      h0 += wx;
    }
    grad[q] = g / n;
    hess[q * m + last] = h0 / n;
    hess[last * m + q] = h0 / n;
  }
  const set = (q: number, r: number, h: number): void => {
    hess[q * m + r] = h / n;
    hess[r * m + q] = h / n;
  };
  for (let q = 0; q < last; q += 2) {
    const a0 = q * n;
    const pair = q + 1 < last;
    const a1 = pair ? a0 + n : a0;
    for (let r = 0; r <= q; r += 2) {
      const b0 = r * n;
      const b1 = r + 1 < last ? b0 + n : b0;
      let s00 = 0, s01 = 0, s10 = 0, s11 = 0;
      for (let i = 0; i < n; i++) {
        const u0 = weighted[a0 + i];
        const u1 = weighted[a1 + i];
        const v0 = xa[b0 + i];
        const v1 = xa[b1 + i];
        s00 += u0 * v0;
        s01 += u0 * v1;
        s10 += u1 * v0;
        s11 += u1 * v1;
      }
      set(q, r, s00);
      if (r + 1 < last) set(q, r + 1, s01);
      if (pair) {
        set(q + 1, r, s10);
        if (r + 1 < last) set(q + 1, r + 1, s11);
      }
    }
  }
  grad[last] = sumR / n;
  hess[last * m + last] = sumW / n;
}
