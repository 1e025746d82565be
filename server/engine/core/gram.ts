import { dotBlock3 } from './dotBlock';

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
   * Computes the missing columns among `wanted`, in panels of three: a 3 x 3 block of dot products
   * at a time (dotBlock3), and entries of columns already known are copied rather than recomputed,
   * so a full build costs about half of p^2 n. Every entry is the same left-to-right sum over rows
   * whichever block computes it, so results do not depend on the order of requests.
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
    for (let start = 0; start < missing.length; start += 3) this.panel(missing.slice(start, start + 3));
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
    // A panel or a triple of other columns with fewer than three repeats its first column; the
    // repeated sums are dropped.
    const a0 = panel[0] * n;
    const a1 = panel.length > 1 ? panel[1] * n : a0;
    const a2 = panel.length > 2 ? panel[2] * n : a0;
    const sums = new Float64Array(9);
    for (let q = 0; q < todo.length; q += 3) {
      const count = Math.min(3, todo.length - q);
      const b0 = todo[q] * n;
      dotBlock3(x, a0, a1, a2, x, b0, count > 1 ? todo[q + 1] * n : b0, count > 2 ? todo[q + 2] * n : b0, n, sums);
      for (let t = 0; t < panel.length; t++) for (let c = 0; c < count; c++) cols[t][todo[q + c]] = sums[3 * t + c] / n;
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
