import { dotBlock3 } from './dotBlock';
import type { KeptHessian } from './newtonScratch';

/**
 * Row-wise kernels of the logistic loss shared by the binomial loss role (loss/binomial.ts), its
 * Newton loop (polishNewton.ts) and the unpenalized fit (unpenalized/binomial.ts). One exp per row
 * gives the loss, the fitted probability and the Newton weight together: with e = exp(-|eta|),
 *   log(1 + exp(eta)) = max(eta, 0) + log1p(e),  mu = 1/(1 + e) (eta >= 0) or e/(1 + e),
 *   mu (1 - mu) = e / (1 + e)^2,
 * so neither mu nor 1 - mu rounds to 0 or 1 early and nothing overflows (common practice).
 */

/**
 * Sum over rows of log(1 + exp(eta_i)) - y_i eta_i (not divided by n); writes mu_i - y_i into
 * `residual` and, when given, mu_i (1 - mu_i) into `weight`.
 */
export function logisticRows(eta: Float64Array, y: Float64Array, n: number, residual: Float64Array, weight: Float64Array | null): number {
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const z = eta[i];
    const e = Math.exp(-Math.abs(z));
    const onePlus = 1 + e;
    sum += (z > 0 ? z : 0) + Math.log1p(e) - y[i] * z;
    residual[i] = (z >= 0 ? 1 / onePlus : e / onePlus) - y[i];
    if (weight) weight[i] = e / (onePlus * onePlus);
  }
  return sum;
}

/**
 * hess (m x m, row-major, m = columns + 1) = [X_A 1]' W [X_A 1] / n, the intercept last, for the
 * columns of `x` starting at `offsets` (column-major, n rows) and the weights w. `weighted` (at
 * least (m - 1) n long) receives w x_q. The slopes' block is summed three weighted columns by three
 * (dotBlock3); each entry is a left-to-right sum over rows.
 */
export function weightedGram(
  x: Float64Array,
  n: number,
  offsets: Int32Array,
  w: Float64Array,
  weighted: Float64Array,
  hess: Float64Array,
): void {
  const last = offsets.length;
  const m = last + 1;
  let sumW = 0;
  for (let i = 0; i < n; i++) sumW += w[i];
  for (let q = 0; q < last; q++) {
    const off = offsets[q];
    const dst = q * n;
    let h0 = 0;
    for (let i = 0; i < n; i++) {
      const wx = w[i] * x[off + i];
      weighted[dst + i] = wx;
      h0 += wx;
    }
    hess[q * m + last] = h0 / n;
    hess[last * m + q] = h0 / n;
  }
  // Entry (q, r), r <= q, is weighted_q'x_r: three weighted columns against three columns at a time
  // (dotBlock3). Sums with r > q (in the diagonal blocks) are computed and dropped, so every kept
  // entry is the same left-to-right sum as one computed alone.
  const sums = new Float64Array(9);
  for (let q = 0; q < last; q += 3) {
    const rows = Math.min(3, last - q);
    const a0 = q * n;
    const a1 = rows > 1 ? a0 + n : a0;
    const a2 = rows > 2 ? a0 + 2 * n : a0;
    const top = q + rows - 1;
    for (let r = 0; r <= top; r += 3) {
      const b0 = offsets[r];
      dotBlock3(weighted, a0, a1, a2, x, b0, r + 1 < last ? offsets[r + 1] : b0, r + 2 < last ? offsets[r + 2] : b0, n, sums);
      for (let t = 0; t < rows; t++) keep(hess, m, n, last, q + t, r, sums[3 * t], sums[3 * t + 1], sums[3 * t + 2]);
    }
  }
  hess[last * m + last] = sumW / n;
}

/** Stores weighted_q'x_r, x_{r+1}, x_{r+2} (those that exist) in both triangles, for columns r' <= q only. */
function keep(hess: Float64Array, m: number, n: number, last: number, q: number, r: number, h0: number, h1: number, h2: number): void {
  if (r <= q) {
    hess[q * m + r] = h0 / n;
    hess[r * m + q] = h0 / n;
  }
  if (r + 1 < last && r + 1 <= q) {
    hess[q * m + r + 1] = h1 / n;
    hess[(r + 1) * m + q] = h1 / n;
  }
  if (r + 2 < last && r + 2 <= q) {
    hess[q * m + r + 2] = h2 / n;
    hess[(r + 2) * m + q] = h2 / n;
  }
}

/* Column kernels of the Newton loop (polishNewton.ts) on the support's columns at `offsets`. */

/**
 * out = v_last + sum_q v_q x_q over the columns at `offsets` (the intercept last in v), four
 * columns per pass over out (a quarter of its loads and stores).
 */
export function imageOf(x: Float64Array, n: number, offsets: Int32Array, v: Float64Array, out: Float64Array): void {
  const last = offsets.length;
  out.fill(v[last], 0, n);
  let q = 0;
  for (; q + 4 <= last; q += 4) {
    const c0 = v[q];
    const c1 = v[q + 1];
    const c2 = v[q + 2];
    const c3 = v[q + 3];
    const o0 = offsets[q];
    const o1 = offsets[q + 1];
    const o2 = offsets[q + 2];
    const o3 = offsets[q + 3];
    for (let i = 0; i < n; i++) out[i] += c0 * x[o0 + i] + c1 * x[o1 + i] + c2 * x[o2 + i] + c3 * x[o3 + i];
  }
  for (; q < last; q++) {
    const c = v[q];
    const off = offsets[q];
    for (let i = 0; i < n; i++) out[i] += c * x[off + i];
  }
}

/**
 * grad_q = x_q'r / n over the columns at `offsets`, four per pass over r, and the intercept's
 * sum(r) / n last.
 */
export function gradientOf(x: Float64Array, n: number, offsets: Int32Array, r: Float64Array, grad: Float64Array): void {
  const last = offsets.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += r[i];
  let q = 0;
  for (; q + 4 <= last; q += 4) {
    const o0 = offsets[q];
    const o1 = offsets[q + 1];
    const o2 = offsets[q + 2];
    const o3 = offsets[q + 3];
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (let i = 0; i < n; i++) {
      const t = r[i];
      s0 += t * x[o0 + i];
      s1 += t * x[o1 + i];
      s2 += t * x[o2 + i];
      s3 += t * x[o3 + i];
    }
    grad[q] = s0 / n;
    grad[q + 1] = s1 / n;
    grad[q + 2] = s2 / n;
    grad[q + 3] = s3 / n;
  }
  for (; q < last; q++) {
    const off = offsets[q];
    let g = 0;
    for (let i = 0; i < n; i++) g += r[i] * x[off + i];
    grad[q] = g / n;
  }
  grad[last] = sum / n;
}

/** out = from + t d */
export function moveAlong(from: Float64Array, d: Float64Array, t: number, out: Float64Array, n: number): void {
  for (let i = 0; i < n; i++) out[i] = from[i] + t * d[i];
}

/**
 * hess (m x m, intercept last) = [X_F 1]' W [X_F 1] / n for the columns `features` at the weights of
 * `last`: entries of columns it already has are copied, new columns' rows computed (m n each).
 */
export function bordered(x: Float64Array, n: number, last: KeptHessian, features: Int32Array, hess: Float64Array): void {
  const m = features.length + 1;
  const mo = last.features.length + 1;
  const index = new Int32Array(m);
  for (let q = 0; q < m - 1; q++) index[q] = last.features.indexOf(features[q]);
  index[m - 1] = mo - 1;
  const w = last.weight;
  for (let q = 0; q < m; q++) {
    if (index[q] >= 0) {
      for (let r = 0; r < m; r++) if (index[r] >= 0) hess[q * m + r] = last.hessian[index[q] * mo + index[r]];
      continue;
    }
    const off = features[q] * n;
    for (let r = 0; r < m; r++) {
      let s = 0;
      if (r === m - 1) for (let i = 0; i < n; i++) s += w[i] * x[off + i];
      else {
        const other = features[r] * n;
        for (let i = 0; i < n; i++) s += w[i] * x[off + i] * x[other + i];
      }
      hess[q * m + r] = s / n;
      hess[r * m + q] = s / n;
    }
  }
}

/** The start is the last solution to the bit (a round that only added columns, at 0). */
export function sameStart(solution: Float64Array, out: Float64Array): boolean {
  if (solution.length === 0 || solution.length > out.length) return false;
  for (let b = 0; b < solution.length; b++) if (solution[b] !== out[b]) return false;
  return true;
}
