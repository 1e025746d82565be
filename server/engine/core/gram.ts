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

  column(j: number): Float64Array {
    const cached = this.columns[j];
    if (cached) return cached;
    this.ensure([j]);
    return this.columns[j] as Float64Array;
  }

  /**
   * Computes the missing columns among `wanted`, four at a time: each pass over a column k feeds four
   * dot products, so X is read a quarter as often. Every entry is the same left-to-right sum over
   * rows whichever way it is computed, so results do not depend on the order of requests.
   */
  ensure(wanted: ArrayLike<number>): void {
    const missing: number[] = [];
    for (let t = 0; t < wanted.length; t++) {
      const j = wanted[t];
      if (!this.columns[j] && !missing.includes(j)) missing.push(j);
    }
    const { x, n, p } = this;
    const full = missing.length - (missing.length % 4);
    for (let t = full; t < missing.length; t++) this.single(missing[t]);
    for (let start = 0; start < full; start += 4) {
      const panel = missing.slice(start, start + 4);
      const cols = panel.map(() => new Float64Array(p));
      const [a0, a1, a2, a3] = panel.map((j) => j * n);
      for (let k = 0; k < p; k++) {
        const known = this.columns[k];
        if (known) {
          for (let t = 0; t < 4; t++) cols[t][k] = known[panel[t]];
          continue;
        }
        const b = k * n;
        let s0 = 0;
        let s1 = 0;
        let s2 = 0;
        let s3 = 0;
        for (let i = 0; i < n; i++) {
          const v = x[b + i];
          s0 += x[a0 + i] * v;
          s1 += x[a1 + i] * v;
          s2 += x[a2 + i] * v;
          s3 += x[a3 + i] * v;
        }
        cols[0][k] = s0 / n;
        cols[1][k] = s1 / n;
        cols[2][k] = s2 / n;
        cols[3][k] = s3 / n;
      }
      for (let t = 0; t < 4; t++) this.columns[panel[t]] = cols[t];
    }
  }

  private single(j: number): void {
    const { x, n, p } = this;
    const col = new Float64Array(p);
    const a = j * n;
    for (let k = 0; k < p; k++) {
      const known = this.columns[k];
      if (known) {
        col[k] = known[j];
        continue;
      }
      const b = k * n;
      let s = 0;
      for (let i = 0; i < n; i++) s += x[a + i] * x[b + i];
      col[k] = s / n;
    }
    this.columns[j] = col;
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
