/**
 * The linear system of the gaussian active-set polish, (G_AA + diag(shift)) b = rhs with
 * G = X'X/n, kept factorized between calls: supports change little from one polish (or one lambda)
 * to the next, so the Cholesky factor is extended a row at a time ("bordered" Cholesky, Golub & Van
 * Loan 2013, "Matrix Computations", 4.2) instead of recomputed: the rows of the longest unchanged
 * leading part are kept, the rest are appended, each at O(m^2). Rows are Jacobi-scaled (raw columns
 * can differ in scale by many orders; the pivot test is relative to the unit diagonal); a pivot below
 * 1e-10 marks a linearly dependent column, whose solution entry is 0. One step of iterative
 * refinement (Higham 2002, "Accuracy and Stability of Numerical Algorithms", ch. 12) recovers the
 * digits the factor loses on nearly collinear columns.
 */
export class SupportSystem {
  private order: number[] = [];
  private shift: number[] = [];
  private stride = 0;
  /** Raw G_AA entries and the factor of the scaled G_AA + diag(shift), row-major with `stride`. */
  private m = new Float64Array(0);
  private l = new Float64Array(0);
  private scale: number[] = [];
  private skip: number[] = [];

  constructor(private readonly entry: (f: number, g: number) => number) {}

  /** Solves for the features in `features` (solution in the same order, into out). */
  solve(features: number[], shifts: number[], rhs: Float64Array, out: Float64Array): boolean {
    const wanted = new Map<number, number>();
    features.forEach((f, q) => wanted.set(f, q));
    let keep = 0;
    while (keep < this.order.length && wanted.get(this.order[keep]) !== undefined && this.shift[keep] === shifts[wanted.get(this.order[keep]) as number]) keep++;
    const order = this.order.slice(0, keep);
    for (const f of this.order.slice(keep)) if (wanted.has(f)) order.push(f);
    const placed = new Set(order);
    for (const f of features) if (!placed.has(f)) order.push(f);
    this.rebuild(order, keep, (f) => shifts[wanted.get(f) as number]);

    const size = order.length;
    const b = new Float64Array(size);
    for (let q = 0; q < size; q++) b[q] = this.scale[q] * rhs[wanted.get(order[q]) as number];
    const z = new Float64Array(size);
    this.substitute(b, z);
    const residual = new Float64Array(size);
    const { stride, m } = this;
    for (let q = 0; q < size; q++) {
      let s = b[q];
      for (let r = 0; r < size; r++) s -= this.scale[q] * (m[q * stride + r] + (q === r ? this.shift[q] : 0)) * this.scale[r] * z[r];
      residual[q] = s;
    }
    const dz = new Float64Array(size);
    this.substitute(residual, dz);
    for (let q = 0; q < size; q++) {
      const value = this.scale[q] * (z[q] + dz[q]);
      if (!Number.isFinite(value)) return false;
      out[wanted.get(order[q]) as number] = value;
    }
    return true;
  }

  /** Keeps rows [0, keep) of the factor, re-lays the matrix for `order`, appends the other rows. */
  private rebuild(order: number[], keep: number, shiftOf: (f: number) => number): void {
    const size = order.length;
    const oldIndex = new Map<number, number>();
    this.order.forEach((f, q) => oldIndex.set(f, q));
    const stride = Math.max(size, this.stride);
    const m = new Float64Array(stride * stride);
    const l = new Float64Array(stride * stride);
    for (let q = 0; q < size; q++) {
      const oq = oldIndex.get(order[q]);
      for (let r = 0; r <= q; r++) {
        const or = oldIndex.get(order[r]);
        let value: number;
        if (oq !== undefined && or !== undefined) value = this.m[oq * this.stride + or];
        else value = this.entry(order[q], order[r]);
        m[q * stride + r] = value;
        m[r * stride + q] = value;
      }
      if (q < keep) for (let r = 0; r <= q; r++) l[q * stride + r] = this.l[q * this.stride + r];
    }
    const scale = this.scale.slice(0, keep);
    const skip = this.skip.slice(0, keep);
    for (let q = keep; q < size; q++) {
      const diag = m[q * stride + q] + shiftOf(order[q]);
      scale.push(diag > 0 ? 1 / Math.sqrt(diag) : 1);
      // Row q of the factor: forward substitution against rows < q, then the pivot.
      let d = scale[q] * diag * scale[q];
      for (let r = 0; r < q; r++) {
        if (skip[r]) continue;
        let s = scale[q] * m[q * stride + r] * scale[r];
        for (let t = 0; t < r; t++) if (!skip[t]) s -= l[q * stride + t] * l[r * stride + t];
        const v = s / l[r * stride + r];
        l[q * stride + r] = v;
        d -= v * v;
      }
      if (d <= 1e-10) skip.push(1);
      else {
        skip.push(0);
        l[q * stride + q] = Math.sqrt(d);
      }
    }
    this.order = order;
    this.shift = order.map(shiftOf);
    this.stride = stride;
    this.m = m;
    this.l = l;
    this.scale = scale;
    this.skip = skip;
  }

  /** L L' z = b on the non-skipped rows; skipped entries 0. */
  private substitute(b: Float64Array, z: Float64Array): void {
    const { l, stride, skip } = this;
    const size = this.order.length;
    for (let q = 0; q < size; q++) {
      if (skip[q]) {
        z[q] = 0;
        continue;
      }
      let s = b[q];
      for (let r = 0; r < q; r++) if (!skip[r]) s -= l[q * stride + r] * z[r];
      z[q] = s / l[q * stride + q];
    }
    for (let q = size - 1; q >= 0; q--) {
      if (skip[q]) continue;
      let s = z[q];
      for (let r = q + 1; r < size; r++) if (!skip[r]) s -= l[r * stride + q] * z[r];
      z[q] = s / l[q * stride + q];
    }
  }
}
