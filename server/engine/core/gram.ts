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
    const { x, n, p } = this;
    const col = new Float64Array(p);
    const offJ = j * n;
    for (let k = 0; k < p; k++) {
      const known = this.columns[k];
      if (known) {
        col[k] = known[j];
        continue;
      }
      const offK = k * n;
      let s = 0;
      for (let i = 0; i < n; i++) s += x[offJ + i] * x[offK + i];
      col[k] = s / n;
    }
    this.columns[j] = col;
    return col;
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
