/**
 * Gram entries of a column against several others: out[t] = G(f, others[t]) for t < count.
 * The design form batches them (several columns per pass over x_f); each must equal entry(f, g).
 */
export type GramEntries = (f: number, others: Int32Array, count: number, out: Float64Array) => void;

/**
 * The linear system of the gaussian active-set polish, (G_AA + diag(shift)) b = rhs with
 * G = X'X/n, kept factorized between calls: supports change little from one polish (or one lambda)
 * to the next, so the Cholesky factor is extended a row at a time ("bordered" Cholesky, Golub & Van
 * Loan 2013, "Matrix Computations", 4.2) instead of recomputed: the rows of the longest unchanged
 * leading part are kept, the rest are appended, each at O(m^2). Rows are Jacobi-scaled (raw columns
 * can differ in scale by many orders; the pivot test is relative to the unit diagonal); a pivot below
 * 1e-10 marks a linearly dependent column, whose solution entry is 0. One step of iterative
 * refinement (Higham 2002, "Accuracy and Stability of Numerical Algorithms", ch. 12), unless the
 * caller waives it, recovers the digits the factor loses on nearly collinear columns.
 *
 * Storage is allocation-free in the steady state: the factor lives in position space (row-major,
 * `stride` grown geometrically), the G entries in a cache of slots, one per column, that outlives
 * the column's stay in the support. Along a path columns leave and join again (the polish's sign
 * flips, the working-set rounds), and an entry is an n-long dot product in the design form: a
 * column that returns finds its entries with the columns still there. Slots not in the support are
 * evicted least recently used first once the cache holds CACHE_SLACK times the support.
 */
export class SupportSystem {
  // Position space: the factored order.
  private size = 0;
  private stride = 0;
  private order = new Int32Array(0);
  private slotAt = new Int32Array(0);
  private shift = new Float64Array(0);
  private scale = new Float64Array(0);
  private skip = new Uint8Array(0);
  /** Factor of the scaled G_AA + diag(shift), row-major with `stride`. */
  private l = new Float64Array(0);
  // Scratch vectors of length stride.
  private b = new Float64Array(0);
  private z = new Float64Array(0);
  private dz = new Float64Array(0);
  private residual = new Float64Array(0);
  private position = new Int32Array(0);
  private others = new Int32Array(0);
  private otherSlots = new Int32Array(0);
  private values = new Float64Array(0);
  private pivot = new Float64Array(0);
  /** By column index: position in the features of the current solve (-1: none), and a mark; reset after each solve. */
  private wantedAt = new Int32Array(0);
  private placed = new Uint8Array(0);

  // Slot space: the G cache.
  private cap = 0;
  private gram = new Float64Array(0);
  private known = new Uint8Array(0);
  private slotFeature = new Int32Array(0);
  private lastUse = new Float64Array(0);
  private readonly slotOf = new Map<number, number>();
  private clock = 0;

  private readonly entries: GramEntries;

  constructor(entry: (f: number, g: number) => number, entries?: GramEntries) {
    this.entries =
      entries ??
      ((f, others, count, out) => {
        for (let t = 0; t < count; t++) out[t] = entry(f, others[t]);
      });
  }

  /**
   * Solves for the features in `features` (solution in the same order, into out), with the step of
   * iterative refinement unless `refine` is false.
   */
  solve(features: ArrayLike<number>, shifts: ArrayLike<number>, rhs: Float64Array, out: Float64Array, refine = true): boolean {
    // Position in `features` of every wanted column (-1: not wanted), by column index.
    let top = 0;
    for (let q = 0; q < features.length; q++) if (features[q] >= top) top = features[q] + 1;
    for (let q = 0; q < this.size; q++) if (this.order[q] >= top) top = this.order[q] + 1;
    if (this.wantedAt.length < top) {
      this.wantedAt = new Int32Array(Math.max(top, 2 * this.wantedAt.length)).fill(-1);
      this.placed = new Uint8Array(this.wantedAt.length);
    }
    const { wantedAt, placed } = this;
    for (let q = 0; q < features.length; q++) wantedAt[features[q]] = q;
    this.dropUnwanted(shifts);
    let keep = 0;
    while (keep < this.size) {
      const q = wantedAt[this.order[keep]];
      if (q < 0 || this.shift[keep] !== shifts[q]) break;
      keep++;
    }
    // The new order: the kept prefix, the old rows after it that are still wanted, then the rest.
    const size = features.length;
    const oldOrder = this.order.subarray(0, this.size).slice();
    this.reserve(size);
    const { order, position } = this;
    let count = keep;
    for (let q = 0; q < keep; q++) placed[order[q]] = 1;
    for (let q = keep; q < oldOrder.length; q++) {
      if (wantedAt[oldOrder[q]] >= 0) {
        order[count++] = oldOrder[q];
        placed[oldOrder[q]] = 1;
      }
    }
    for (let q = 0; q < features.length; q++) if (!placed[features[q]]) order[count++] = features[q];
    for (let q = 0; q < size; q++) {
      position[q] = wantedAt[order[q]];
      this.shift[q] = shifts[position[q]];
    }
    for (let q = 0; q < features.length; q++) {
      wantedAt[features[q]] = -1;
      placed[features[q]] = 0;
    }
    this.size = size;
    this.extend(keep);

    const { scale, shift, slotAt, gram, cap, b, z, dz, residual } = this;
    for (let q = 0; q < size; q++) b[q] = scale[q] * rhs[position[q]];
    this.substitute(b, z);
    if (!refine) {
      for (let q = 0; q < size; q++) {
        const value = scale[q] * z[q];
        if (!Number.isFinite(value)) return false;
        out[position[q]] = value;
      }
      return true;
    }
    // Refinement: r = D b - D (G + diag(shift)) D z, then the correction from the same factor.
    for (let r = 0; r < size; r++) dz[r] = scale[r] * z[r];
    for (let q = 0; q < size; q++) {
      let s = 0;
      const row = slotAt[q] * cap;
      for (let r = 0; r < size; r++) s += gram[row + slotAt[r]] * dz[r];
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
  private dropUnwanted(shifts: ArrayLike<number>): void {
    const { wantedAt } = this;
    let drop = 0;
    for (let q = 0; q < this.size; q++) {
      if (this.skip[q]) return;
      const at = wantedAt[this.order[q]];
      if (at < 0) drop++;
      else if (this.shift[q] !== shifts[at]) return;
    }
    if (drop === 0) return;
    for (let q = this.size - 1; q >= 0; q--) if (wantedAt[this.order[q]] < 0) this.removeRow(q);
  }

  private removeRow(q: number): void {
    const { stride, l } = this;
    const size = this.size;
    const k = size - q - 1;
    const x = this.dz;
    for (let i = 0; i < k; i++) x[i] = l[(q + 1 + i) * stride + q];
    // Rows after q move up one, dropping column q (each source lies after its target).
    for (let r = q; r < size - 1; r++) {
      const to = r * stride;
      const from = (r + 1) * stride;
      l.copyWithin(to, from, from + q);
      l.copyWithin(to + q, from + q + 1, from + r + 2);
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
    this.order.copyWithin(q, q + 1, size);
    this.slotAt.copyWithin(q, q + 1, size);
    this.shift.copyWithin(q, q + 1, size);
    this.scale.copyWithin(q, q + 1, size);
    this.skip.copyWithin(q, q + 1, size);
    this.size = size - 1;
  }

  /** Room for `size` positions (the factor and the scratch vectors grow geometrically). */
  private reserve(size: number): void {
    if (size <= this.stride) return;
    const stride = Math.max(size, 2 * this.stride, 16);
    const l = new Float64Array(stride * stride);
    for (let q = 0; q < this.size; q++) l.set(this.l.subarray(q * this.stride, q * this.stride + q + 1), q * stride);
    this.l = l;
    const grow = <T extends Float64Array | Int32Array | Uint8Array>(old: T, make: (m: number) => T): T => {
      const next = make(stride);
      next.set(old);
      return next;
    };
    this.order = grow(this.order, (m) => new Int32Array(m));
    this.slotAt = grow(this.slotAt, (m) => new Int32Array(m));
    this.shift = grow(this.shift, (m) => new Float64Array(m));
    this.scale = grow(this.scale, (m) => new Float64Array(m));
    this.skip = grow(this.skip, (m) => new Uint8Array(m));
    this.b = new Float64Array(stride);
    this.z = new Float64Array(stride);
    this.dz = new Float64Array(stride);
    this.residual = new Float64Array(stride);
    this.position = new Int32Array(stride);
    this.others = new Int32Array(stride);
    this.otherSlots = new Int32Array(stride);
    this.values = new Float64Array(stride);
    this.pivot = new Float64Array(stride);
    this.stride = stride;
  }

  /** Rows [0, keep) of the factor stay; rows keep.. are computed for the current order. */
  private extend(keep: number): void {
    const { size, order, shift } = this;
    const stamp = ++this.clock;
    // Every cached column of the support is stamped before any eviction can pick it.
    for (let q = 0; q < size; q++) {
      const cached = this.slotOf.get(order[q]);
      if (cached !== undefined) this.lastUse[cached] = stamp;
    }
    for (let q = keep; q < size; q++) {
      this.slotAt[q] = this.slotFor(order[q], stamp);
      this.lastUse[this.slotAt[q]] = stamp;
    }
    const { stride, l, scale, skip, slotAt, others, values, pivot } = this;
    // G entries of the new rows, one new row q at a time against every column r <= q that misses
    // its entry: the batch is long (the whole support), so the design form's products run several
    // columns per pass over x_q. Batching by r instead (x_r against the new rows) gives batches of
    // one or two along a path, where few columns join per solve: one latency-bound sum per entry.
    // An entry is the same number either way (x_q'x_r sums the same products in the same order).
    const { known, cap: slots, otherSlots } = this;
    for (let q = keep; q < size; q++) {
      const sq = slotAt[q];
      let missing = 0;
      for (let r = 0; r <= q; r++) {
        if (!known[sq * slots + slotAt[r]]) {
          others[missing] = order[r];
          otherSlots[missing++] = slotAt[r];
        }
      }
      if (missing === 0) continue;
      this.entries(order[q], others, missing, values);
      for (let t = 0; t < missing; t++) this.store(sq, otherSlots[t], values[t]);
    }
    const { gram, cap } = this;
    for (let q = keep; q < size; q++) {
      const diag = gram[slotAt[q] * cap + slotAt[q]] + shift[q];
      scale[q] = diag > 0 ? 1 / Math.sqrt(diag) : 1;
      pivot[q] = scale[q] * diag * scale[q];
    }
    // Rows q >= keep of the factor: forward substitution against rows < q, then the pivot. Against
    // the kept rows the new rows are independent, so each kept row is read once for all of them.
    for (let r = 0; r < keep; r++) {
      const other = r * stride;
      if (skip[r]) {
        for (let q = keep; q < size; q++) l[q * stride + r] = 0;
        continue;
      }
      const sr = slotAt[r];
      const pivotR = l[other + r];
      let q = keep;
      // Four new rows per pass over row r (each the same sum as one row at a time).
      for (; q + 4 <= size; q += 4) {
        const r0 = q * stride;
        const r1 = r0 + stride;
        const r2 = r1 + stride;
        const r3 = r2 + stride;
        let s0 = scale[q] * gram[slotAt[q] * cap + sr] * scale[r];
        let s1 = scale[q + 1] * gram[slotAt[q + 1] * cap + sr] * scale[r];
        let s2 = scale[q + 2] * gram[slotAt[q + 2] * cap + sr] * scale[r];
        let s3 = scale[q + 3] * gram[slotAt[q + 3] * cap + sr] * scale[r];
        for (let t = 0; t < r; t++) {
          const lt = l[other + t];
          s0 -= l[r0 + t] * lt;
          s1 -= l[r1 + t] * lt;
          s2 -= l[r2 + t] * lt;
          s3 -= l[r3 + t] * lt;
        }
        const v0 = s0 / pivotR;
        const v1 = s1 / pivotR;
        const v2 = s2 / pivotR;
        const v3 = s3 / pivotR;
        l[r0 + r] = v0;
        l[r1 + r] = v1;
        l[r2 + r] = v2;
        l[r3 + r] = v3;
        pivot[q] -= v0 * v0;
        pivot[q + 1] -= v1 * v1;
        pivot[q + 2] -= v2 * v2;
        pivot[q + 3] -= v3 * v3;
      }
      for (; q < size; q++) {
        // One new row (the common case along a path): four partial sums, as in substitute.
        const row = q * stride;
        let s0 = 0;
        let s1 = 0;
        let s2 = 0;
        let s3 = 0;
        let t = 0;
        for (; t + 4 <= r; t += 4) {
          s0 += l[row + t] * l[other + t];
          s1 += l[row + t + 1] * l[other + t + 1];
          s2 += l[row + t + 2] * l[other + t + 2];
          s3 += l[row + t + 3] * l[other + t + 3];
        }
        for (; t < r; t++) s0 += l[row + t] * l[other + t];
        const s = scale[q] * gram[slotAt[q] * cap + sr] * scale[r] - (s0 + s1 + (s2 + s3));
        const v = s / pivotR;
        l[row + r] = v;
        pivot[q] -= v * v;
      }
    }
    for (let q = keep; q < size; q++) {
      const row = q * stride;
      const grow = slotAt[q] * cap;
      let d = pivot[q];
      for (let r = keep; r < q; r++) {
        if (skip[r]) {
          l[row + r] = 0;
          continue;
        }
        let s = scale[q] * gram[grow + slotAt[r]] * scale[r];
        const other = r * stride;
        for (let t = 0; t < r; t++) s -= l[row + t] * l[other + t];
        const v = s / l[other + r];
        l[row + r] = v;
        d -= v * v;
      }
      if (d <= 1e-10) {
        skip[q] = 1;
        l[row + q] = 0;
      } else {
        skip[q] = 0;
        l[row + q] = Math.sqrt(d);
      }
    }
  }

  private store(s: number, t: number, value: number): void {
    const { cap } = this;
    this.gram[s * cap + t] = value;
    this.gram[t * cap + s] = value;
    this.known[s * cap + t] = 1;
    this.known[t * cap + s] = 1;
  }

  /** The slot of feature f: its cached one, a free one, the least recently used outside the support, or a new one. */
  private slotFor(f: number, stamp: number): number {
    const cached = this.slotOf.get(f);
    if (cached !== undefined) return cached;
    let slot = -1;
    if (this.slotOf.size < this.cap) {
      for (let s = 0; s < this.cap; s++) {
        if (this.slotFeature[s] < 0) {
          slot = s;
          break;
        }
      }
    } else if (this.cap >= CACHE_SLACK * this.size) {
      // Least recently used slot outside the current support (stamped before this solve).
      let oldest = Infinity;
      for (let s = 0; s < this.cap; s++) {
        if (this.lastUse[s] < stamp && this.lastUse[s] < oldest) {
          oldest = this.lastUse[s];
          slot = s;
        }
      }
      if (slot >= 0) this.slotOf.delete(this.slotFeature[slot]);
    }
    if (slot < 0) {
      slot = this.cap;
      this.growCache(Math.max(Math.ceil(CACHE_SLACK * this.size), Math.ceil(1.5 * this.cap), 16));
    }
    const { cap } = this;
    for (let t = 0; t < cap; t++) {
      this.known[slot * cap + t] = 0;
      this.known[t * cap + slot] = 0;
    }
    this.slotFeature[slot] = f;
    this.slotOf.set(f, slot);
    return slot;
  }

  private growCache(cap: number): void {
    const old = this.cap;
    const gram = new Float64Array(cap * cap);
    const known = new Uint8Array(cap * cap);
    for (let s = 0; s < old; s++) {
      gram.set(this.gram.subarray(s * old, (s + 1) * old), s * cap);
      known.set(this.known.subarray(s * old, (s + 1) * old), s * cap);
    }
    const slotFeature = new Int32Array(cap).fill(-1);
    slotFeature.set(this.slotFeature);
    const lastUse = new Float64Array(cap);
    lastUse.set(this.lastUse);
    this.gram = gram;
    this.known = known;
    this.slotFeature = slotFeature;
    this.lastUse = lastUse;
    this.cap = cap;
  }

  /** L L' z = b on the non-skipped rows; skipped entries 0. */
  private substitute(b: Float64Array, z: Float64Array): void {
    const { l, stride, skip, size } = this;
    for (let q = 0; q < size; q++) {
      if (skip[q]) {
        z[q] = 0;
        continue;
      }
      // Four partial sums: one running sum waits on each add's latency (common practice).
      const row = q * stride;
      let s0 = 0;
      let s1 = 0;
      let s2 = 0;
      let s3 = 0;
      let r = 0;
      for (; r + 4 <= q; r += 4) {
        s0 += l[row + r] * z[r];
        s1 += l[row + r + 1] * z[r + 1];
        s2 += l[row + r + 2] * z[r + 2];
        s3 += l[row + r + 3] * z[r + 3];
      }
      for (; r < q; r++) s0 += l[row + r] * z[r];
      z[q] = (b[q] - (s0 + s1 + (s2 + s3))) / l[row + q];
    }
    // L' z = y by columns of L' (rows of L): contiguous reads where the dot-product form would
    // stride down a column. Two rows per pass over z (half its loads and stores); a skipped row
    // counts as a zero (its z entry is 0 and the other rows' entries in its column are 0).
    let q = size - 1;
    for (; q >= 1; q -= 2) {
      const row = q * stride;
      const prev = row - stride;
      const v = skip[q] ? 0 : z[q] / l[row + q];
      z[q] = v;
      const u = skip[q - 1] ? 0 : (z[q - 1] - l[row + q - 1] * v) / l[prev + q - 1];
      z[q - 1] = u;
      if (v !== 0 || u !== 0) for (let r = 0; r < q - 1; r++) z[r] -= l[row + r] * v + l[prev + r] * u;
    }
    if (q === 0) z[0] = skip[0] ? 0 : z[0] / l[0];
  }
}

/**
 * The G cache holds up to this many times the support's columns before it evicts: room for the
 * columns that leave and come back along a path, at (1.5 m)^2 * 9 bytes (about 6 MB at m = 540).
 */
const CACHE_SLACK = 1.5;
