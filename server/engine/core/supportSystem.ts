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
  private shift: Float64Array = new Float64Array(0);
  private stride = 0;
  /** Raw G_AA entries and the factor of the scaled G_AA + diag(shift), row-major with `stride`. */
  private m: Float64Array = new Float64Array(0);
  private l: Float64Array = new Float64Array(0);
  private scale: number[] = [];
  private skip: number[] = [];

  constructor(private readonly entry: (f: number, g: number) => number) {}

  /** Solves for the features in `features` (solution in the same order, into out). */
  solve(features: number[], shifts: number[], rhs: Float64Array, out: Float64Array): boolean {
    const wanted = new Map<number, number>();
    features.forEach((f, q) => wanted.set(f, q));
    this.dropUnwanted(wanted, shifts);
    let keep = 0;
    while (keep < this.order.length) {
      const q = wanted.get(this.order[keep]);
      if (q === undefined || this.shift[keep] !== shifts[q]) break;
      keep++;
    }
    const order = this.order.slice(0, keep);
    for (const f of this.order.slice(keep)) if (wanted.has(f)) order.push(f);
    const placed = new Set(order);
    for (const f of features) if (!placed.has(f)) order.push(f);
    const position = Int32Array.from(order, (f) => wanted.get(f) as number);
    this.rebuild(order, keep, Float64Array.from(position, (q) => shifts[q]));

    const size = order.length;
    const { stride, m, scale, shift } = this;
    const b = new Float64Array(size);
    for (let q = 0; q < size; q++) b[q] = scale[q] * rhs[position[q]];
    const z = new Float64Array(size);
    this.substitute(b, z);
    // Refinement: r = D b - D (G + diag(shift)) D z, then the correction from the same factor.
    const dz = new Float64Array(size);
    for (let r = 0; r < size; r++) dz[r] = scale[r] * z[r];
    const residual = new Float64Array(size);
    for (let q = 0; q < size; q++) {
      let s = 0;
      const row = q * stride;
      for (let r = 0; r < size; r++) s += m[row + r] * dz[r];
      residual[q] = b[q] - scale[q] * (s + shift[q] * dz[q]);
    }
    this.substitute(residual, dz);
    for (let q = 0; q < size; q++) {
      const value = scale[q] * (z[q] + dz[q]);
      if (!Number.isFinite(value)) return false;
      out[position[q]] = value;
    }
    return true;
  }

  /**
   * Columns that left the support are deleted from the factor in place when every remaining one
   * keeps its shift (always for the lasso) and no row was skipped: deleting row and column q of
   * L L' leaves the rows above q as they are and turns the trailing block into a rank-one update
   * L33 L33' + l32 l32', done by rotations at O(k^2) (Golub & Van Loan 2013, 6.5.4) instead of
   * refactoring every row after q at O(k m^2).
   */
  private dropUnwanted(wanted: Map<number, number>, shifts: number[]): void {
    const size = this.order.length;
    let drop = 0;
    for (let q = 0; q < size; q++) {
      if (this.skip[q]) return;
      const at = wanted.get(this.order[q]);
      if (at === undefined) drop++;
      else if (this.shift[q] !== shifts[at]) return;
    }
    if (drop === 0) return;
    for (let q = size - 1; q >= 0; q--) if (!wanted.has(this.order[q])) this.removeRow(q);
  }

  private removeRow(q: number): void {
    const { stride, m, l } = this;
    const size = this.order.length;
    const k = size - q - 1;
    const x = new Float64Array(k);
    for (let i = 0; i < k; i++) x[i] = l[(q + 1 + i) * stride + q];
    // Shift the entries after row / column q up and left (each source lies after its target).
    const from = (i: number): number => (i < q ? i : i + 1);
    for (let r = 0; r < size - 1; r++) {
      for (let c = 0; c < size - 1; c++) m[r * stride + c] = m[from(r) * stride + from(c)];
    }
    for (let r = q; r < size - 1; r++) {
      for (let c = 0; c <= r; c++) l[r * stride + c] = l[(r + 1) * stride + from(c)];
    }
    for (let j = 0; j < k; j++) {
      const jj = (q + j) * stride + q + j;
      const pivot = l[jj];
      const radius = Math.hypot(pivot, x[j]);
      const cos = radius / pivot;
      const sin = x[j] / pivot;
      l[jj] = radius;
      for (let i = j + 1; i < k; i++) {
        const at = (q + i) * stride + q + j;
        l[at] = (l[at] + sin * x[i]) / cos;
        x[i] = cos * x[i] - sin * l[at];
      }
    }
    this.order.splice(q, 1);
    this.scale.splice(q, 1);
    this.skip.splice(q, 1);
    const shift = new Float64Array(size - 1);
    for (let i = 0; i < size - 1; i++) shift[i] = this.shift[from(i)];
    this.shift = shift;
  }

  /**
   * Keeps rows [0, keep) of the factor, re-lays the matrix for `order`, appends the other rows. When
   * the old order is kept whole the arrays are extended in place.
   */
  private rebuild(order: number[], keep: number, shift: Float64Array): void {
    const size = order.length;
    const inPlace = keep === this.order.length && size <= this.stride;
    const stride = size <= this.stride ? this.stride : Math.max(size, 2 * this.stride, 16);
    let { m, l } = this;
    if (!inPlace) {
      const oldIndex = new Map<number, number>();
      this.order.forEach((f, q) => oldIndex.set(f, q));
      const old = Int32Array.from(order, (f) => oldIndex.get(f) ?? -1);
      m = new Float64Array(stride * stride);
      l = new Float64Array(stride * stride);
      for (let q = 0; q < size; q++) {
        if (old[q] < 0) continue;
        const from = old[q] * this.stride;
        for (let r = 0; r <= q; r++) {
          if (old[r] < 0) continue;
          m[q * stride + r] = this.m[from + old[r]];
          m[r * stride + q] = this.m[from + old[r]];
        }
        if (q < keep) for (let r = 0; r <= q; r++) l[q * stride + r] = this.l[q * this.stride + r];
      }
    }
    const wasKnown = new Set(this.order);
    const known = Uint8Array.from(order, (f) => (wasKnown.has(f) ? 1 : 0));
    for (let q = 0; q < size; q++) {
      const row = q * stride;
      for (let r = 0; r <= q; r++) {
        if (known[q] && known[r]) continue;
        const value = this.entry(order[q], order[r]);
        m[row + r] = value;
        m[r * stride + q] = value;
      }
    }
    const scale = this.scale.slice(0, keep);
    const skip = this.skip.slice(0, keep);
    for (let q = keep; q < size; q++) {
      const row = q * stride;
      const diag = m[row + q] + shift[q];
      scale.push(diag > 0 ? 1 / Math.sqrt(diag) : 1);
      // Row q of the factor: forward substitution against rows < q, then the pivot.
      let d = scale[q] * diag * scale[q];
      for (let r = 0; r < q; r++) {
        if (skip[r]) {
          l[row + r] = 0;
          continue;
        }
        let s = scale[q] * m[row + r] * scale[r];
        const other = r * stride;
        for (let t = 0; t < r; t++) s -= l[row + t] * l[other + t];
        const v = s / l[other + r];
        l[row + r] = v;
        d -= v * v;
      }
      if (d <= 1e-10) {
        skip.push(1);
        l[row + q] = 0;
      } else {
        skip.push(0);
        l[row + q] = Math.sqrt(d);
      }
    }
    this.order = order;
    this.shift = shift;
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
      for (let r = 0; r < q; r++) s -= l[q * stride + r] * z[r];
      z[q] = s / l[q * stride + q];
    }
    for (let q = size - 1; q >= 0; q--) {
      if (skip[q]) continue;
      let s = z[q];
      for (let r = q + 1; r < size; r++) s -= l[r * stride + q] * z[r];
      z[q] = s / l[q * stride + q];
    }
  }
}
