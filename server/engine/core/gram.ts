/**
 * Columns of the Gram matrix G = X'X/n, computed on first use and kept: the gaussian solver on
 * n >> p works on G alone (its iterations cost |W|^2, not n|W|), and the dual projection on the
 * unpenalized columns needs G[:, U] in every mode.
 */
export class GramCache {
  private readonly columns: (Float64Array | undefined)[];

  constructor(
    private readonly x: Float64Array,
    private readonly n: number,
    private readonly p: number,
  ) {
    this.columns = new Array<Float64Array | undefined>(p);
  }

  /** Supplies column j from elsewhere (e.g. cross products of the same rows). */
  preset(j: number, column: Float64Array): void {
    this.columns[j] = column;
  }

  column(j: number): Float64Array {
    const cached = this.columns[j];
    if (cached) return cached;
    this.ensure([j]);
    return this.columns[j] as Float64Array;
  }

  /**
   * Computes the missing columns among `wanted`, in panels of four: a 4 x 2 block of dot products per
   * pass over the rows (register blocking: 8 sums from 6 loads per row), and entries of columns
   * already known are copied rather than recomputed, so a full build costs about half of p^2 n.
   * Every entry is the same left-to-right sum over rows whichever kernel computes it, so results do
   * not depend on the order of requests.
   */
  ensure(wanted: ArrayLike<number>): void {
    const seen = new Uint8Array(this.p);
    const missing: number[] = [];
    for (let t = 0; t < wanted.length; t++) {
      const j = wanted[t];
      if (!this.columns[j] && !seen[j]) {
        seen[j] = 1;
        missing.push(j);
      }
    }
    for (let start = 0; start < missing.length; start += 4) this.panel(missing.slice(start, start + 4));
  }

  private panel(panel: number[]): void {
    const { x, n, p } = this;
    const cols = panel.map(() => new Float64Array(p));
    const todo: number[] = [];
    for (let k = 0; k < p; k++) {
      const known = this.columns[k];
      if (known) for (let t = 0; t < panel.length; t++) cols[t][k] = known[panel[t]];
      else todo.push(k);
    }
    const offsets = panel.map((j) => j * n);
    let q = 0;
    if (panel.length === 4) {
      const [a0, a1, a2, a3] = offsets;
      const [c0, c1, c2, c3] = cols;
      for (; q + 1 < todo.length; q += 2) {
        const k0 = todo[q];
        const k1 = todo[q + 1];
        const b0 = k0 * n;
        const b1 = k1 * n;
        let s00 = 0, s01 = 0, s10 = 0, s11 = 0, s20 = 0, s21 = 0, s30 = 0, s31 = 0;
        for (let i = 0; i < n; i++) {
          const u = x[b0 + i];
          const v = x[b1 + i];
          const x0 = x[a0 + i];
          const x1 = x[a1 + i];
          const x2 = x[a2 + i];
          const x3 = x[a3 + i];
          s00 += x0 * u;
          s01 += x0 * v;
          s10 += x1 * u;
          s11 += x1 * v;
          s20 += x2 * u;
          s21 += x2 * v;
          s30 += x3 * u;
          s31 += x3 * v;
        }
        c0[k0] = s00 / n;
        c0[k1] = s01 / n;
        c1[k0] = s10 / n;
        c1[k1] = s11 / n;
        c2[k0] = s20 / n;
        c2[k1] = s21 / n;
        c3[k0] = s30 / n;
        c3[k1] = s31 / n;
      }
    }
    for (; q < todo.length; q++) {
      const b = todo[q] * n;
      for (let t = 0; t < panel.length; t++) {
        const a = offsets[t];
        let s = 0;
        for (let i = 0; i < n; i++) s += x[a + i] * x[b + i];
        cols[t][todo[q]] = s / n;
      }
    }
    for (let t = 0; t < panel.length; t++) this.columns[panel[t]] = cols[t];
  }
}

/**
 * Cholesky factor of a small symmetric positive semi-definite m x m matrix (row-major); pivots below
 * 1e-10 of the largest diagonal mark linearly dependent columns, whose solution entries are set to 0
 * (the span, and so the projection built on it, is unchanged).
 */
export class SemidefiniteSolver {
  private readonly l: Float64Array;
  private readonly skip: Uint8Array;

  constructor(
    matrix: Float64Array,
    private readonly m: number,
  ) {
    const l = new Float64Array(matrix);
    const skip = new Uint8Array(m);
    let maxDiag = 0;
    for (let i = 0; i < m; i++) maxDiag = Math.max(maxDiag, matrix[i * m + i]);
    for (let j = 0; j < m; j++) {
      let d = l[j * m + j];
      for (let k = 0; k < j; k++) if (!skip[k]) d -= l[j * m + k] * l[j * m + k];
      if (d <= 1e-10 * maxDiag) {
        skip[j] = 1;
        continue;
      }
      const root = Math.sqrt(d);
      l[j * m + j] = root;
      for (let i = j + 1; i < m; i++) {
        let s = l[i * m + j];
        for (let k = 0; k < j; k++) if (!skip[k]) s -= l[i * m + k] * l[j * m + k];
        l[i * m + j] = s / root;
      }
    }
    this.l = l;
    this.skip = skip;
  }

  /** Solves M x = b (least-norm on dependent columns), writing x into out. */
  solve(b: Float64Array, out: Float64Array): void {
    const { l, m, skip } = this;
    for (let i = 0; i < m; i++) {
      if (skip[i]) {
        out[i] = 0;
        continue;
      }
      let s = b[i];
      for (let k = 0; k < i; k++) if (!skip[k]) s -= l[i * m + k] * out[k];
      out[i] = s / l[i * m + i];
    }
    for (let i = m - 1; i >= 0; i--) {
      if (skip[i]) continue;
      let s = out[i];
      for (let k = i + 1; k < m; k++) if (!skip[k]) s -= l[k * m + i] * out[k];
      out[i] = s / l[i * m + i];
    }
  }
}
