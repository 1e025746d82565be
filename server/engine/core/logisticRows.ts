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
 * least (m - 1) n long) receives w x_q. The slopes' block is summed two by two columns per pass over
 * the rows (4 sums from 4 loads); each entry is a left-to-right sum over rows.
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
  const set = (q: number, r: number, h: number): void => {
    hess[q * m + r] = h / n;
    hess[r * m + q] = h / n;
  };
  for (let q = 0; q < last; q += 2) {
    const a0 = q * n;
    const pair = q + 1 < last;
    const a1 = pair ? a0 + n : a0;
    for (let r = 0; r <= q; r += 2) {
      const b0 = offsets[r];
      const b1 = r + 1 < last ? offsets[r + 1] : b0;
      let s00 = 0, s01 = 0, s10 = 0, s11 = 0;
      for (let i = 0; i < n; i++) {
        const u0 = weighted[a0 + i];
        const u1 = weighted[a1 + i];
        const v0 = x[b0 + i];
        const v1 = x[b1 + i];
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
  hess[last * m + last] = sumW / n;
}
