/**
 * Weighted least squares with an unpenalized intercept by Householder QR (Golub & Van Loan,
 * "Matrix Computations", 4th ed., section 5.3), used for the gaussian fit and for every
 * Newton/IRLS step of the binomial fit.
 *
 *   minimize sum_i w_i (y_i - b0 - x_i'b)^2
 *
 * Columns are centred by their weighted means, which makes sqrt(w) (the intercept column) orthogonal
 * to the rest, so the intercept separates out exactly; they are then scaled to unit norm. Centring is
 * what lets ill-conditioned data such as NIST's Longley reach 10+ digits. One step of iterative
 * refinement (re-solving for the residual) recovers the digits lost in forming the right-hand side.
 * Rank: a column whose norm left after the earlier columns' reflections is below RANK_TOLERANCE of
 * its own norm is an exact linear combination of earlier ones and is left out (reported as aliased).
 */

/**
 * Relative norm below which a column counts as aliased: sqrt(machine epsilon), about 1.5e-8. A
 * column left with less than that share of its norm after the earlier columns are projected out has
 * lost at least half of its double-precision digits to cancellation, so its coefficient would be
 * mostly rounding noise.
 */
export const RANK_TOLERANCE = Math.sqrt(Number.EPSILON);

export interface LeastSquaresFit {
  /** Slope for each column; NaN for aliased columns. */
  beta: Float64Array;
  intercept: number;
  /** Indices of aliased columns. */
  aliased: number[];
  /** Number of estimated slopes (p minus aliased). */
  rank: number;
  /** Unscaled variances (sigma^2 = 1): diag (X'WX)^-1 for the slopes (NaN when aliased) and b0. */
  slopeVariance: Float64Array;
  interceptVariance: number;
  refinements: number;
}

interface Factorization {
  /** Unit Householder vectors; reflector k acts on rows k..n-1. */
  reflectors: Float64Array[];
  /** Upper-triangular R (rank x rank) row-major, for kept columns in order. */
  r: Float64Array;
  kept: number[];
  scale: Float64Array;
}

export function weightedLeastSquares(
  n: number,
  p: number,
  x: Float64Array,
  y: Float64Array,
  w: Float64Array | null,
): LeastSquaresFit {
  const sw = new Float64Array(n);
  let wsum = 0;
  for (let i = 0; i < n; i++) {
    const wi = w ? w[i] : 1;
    sw[i] = Math.sqrt(wi);
    wsum += wi;
  }
  const xbar = new Float64Array(p);
  const a = new Float64Array(n * p);
  const scale = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    const col = x.subarray(j * n, (j + 1) * n);
    xbar[j] = weightedMean(col, w, wsum);
    let ss = 0;
    for (let i = 0; i < n; i++) {
      const v = sw[i] * (col[i] - xbar[j]);
      a[j * n + i] = v;
      ss += v * v;
    }
    scale[j] = Math.sqrt(ss);
    if (scale[j] > 0) for (let i = 0; i < n; i++) a[j * n + i] /= scale[j];
  }
  const ybar = weightedMean(y, w, wsum);
  const rhs = new Float64Array(n);
  for (let i = 0; i < n; i++) rhs[i] = sw[i] * (y[i] - ybar);

  const f = factorize(n, p, a, scale);
  const c = solve(f, rhs);
  // Refinement: residual of the centred, weighted problem, solved again with the same factors.
  const resid = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let fitted = 0;
    for (let k = 0; k < f.kept.length; k++) {
      const j = f.kept[k];
      fitted += (x[j * n + i] - xbar[j]) * (c[k] / scale[j]);
    }
    resid[i] = sw[i] * (y[i] - ybar - fitted);
  }
  const dc = solve(f, resid);
  for (let k = 0; k < c.length; k++) c[k] += dc[k];

  const beta = new Float64Array(p).fill(Number.NaN);
  let intercept = ybar;
  for (let k = 0; k < f.kept.length; k++) {
    const j = f.kept[k];
    beta[j] = c[k] / scale[j];
    intercept -= xbar[j] * beta[j];
  }
  const { slopeVariance, interceptVariance } = variances(f, p, xbar, wsum);
  const aliased = [];
  for (let j = 0; j < p; j++) if (!f.kept.includes(j)) aliased.push(j);
  return { beta, intercept, aliased, rank: f.kept.length, slopeVariance, interceptVariance, refinements: 1 };
}

function weightedMean(v: Float64Array, w: Float64Array | null, wsum: number): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += (w ? w[i] : 1) * v[i];
  return s / wsum;
}

/** Householder QR without pivoting; aliased columns are skipped in place (order is kept). */
function factorize(n: number, p: number, a: Float64Array, scale: Float64Array): Factorization {
  const reflectors: Float64Array[] = [];
  const kept: number[] = [];
  const diagonal: number[] = [];
  let k = 0;
  for (let j = 0; j < p && k < n; j++) {
    if (scale[j] === 0) continue; // constant column: aliased with the intercept
    let norm = 0;
    for (let i = k; i < n; i++) norm += a[j * n + i] ** 2;
    norm = Math.sqrt(norm);
    if (norm <= RANK_TOLERANCE) continue;
    const alpha = a[j * n + k] > 0 ? -norm : norm;
    const v = new Float64Array(n - k);
    for (let i = k; i < n; i++) v[i - k] = a[j * n + i];
    v[0] -= alpha;
    const vv = dot(v, v);
    for (let l = j + 1; l < p; l++) reflect(a.subarray(l * n + k, (l + 1) * n), v, vv);
    reflectors.push(normalized(v, vv));
    kept.push(j);
    diagonal.push(alpha);
    k++;
  }
  // R's rows: entry (r, kept[c]) for c >= r, read from the reflected matrix.
  const rank = kept.length;
  const r = new Float64Array(rank * rank);
  for (let row = 0; row < rank; row++) {
    r[row * rank + row] = diagonal[row];
    for (let col = row + 1; col < rank; col++) r[row * rank + col] = a[kept[col] * n + row];
  }
  return { reflectors, r, kept, scale };
}

/** Applies H = I - 2 v v' / (v'v) to u in place. */
function reflect(u: Float64Array, v: Float64Array, vv: number): void {
  const s = (2 * dot(u, v)) / vv;
  for (let i = 0; i < v.length; i++) u[i] -= s * v[i];
}

function normalized(v: Float64Array, vv: number): Float64Array {
  const out = new Float64Array(v.length);
  const s = Math.sqrt(vv);
  for (let i = 0; i < v.length; i++) out[i] = v[i] / s;
  return out;
}

function dot(u: Float64Array, v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += u[i] * v[i];
  return s;
}

/** Least-squares solution in the scaled, kept coordinates: R c = (Q'b)[0:rank]. */
function solve(f: Factorization, b: Float64Array): Float64Array {
  const qb = Float64Array.from(b);
  f.reflectors.forEach((v, k) => reflect(qb.subarray(k), v, 1));
  const rank = f.kept.length;
  const c = new Float64Array(rank);
  for (let row = rank - 1; row >= 0; row--) {
    let s = qb[row];
    for (let col = row + 1; col < rank; col++) s -= f.r[row * rank + col] * c[col];
    c[row] = s / f.r[row * rank + row];
  }
  return c;
}

/**
 * diag of (X_c'WX_c)^-1 = S^-1 R^-1 R^-T S^-1 (row sums of squares of R^-1), and the intercept's
 * variance 1/sum(w) + xbar' Cov(b) xbar = 1/sum(w) + ||R^-T S^-1 xbar||^2, a sum of squares with no
 * cancellation.
 */
function variances(f: Factorization, p: number, xbar: Float64Array, wsum: number) {
  const rank = f.kept.length;
  const rinv = invertUpper(f.r, rank);
  const slopeVariance = new Float64Array(p).fill(Number.NaN);
  const u = new Float64Array(rank); // u = R^-T S^-1 xbar
  for (let row = 0; row < rank; row++) {
    let ss = 0;
    for (let col = row; col < rank; col++) ss += rinv[row * rank + col] ** 2;
    const j = f.kept[row];
    slopeVariance[j] = ss / f.scale[j] ** 2;
  }
  for (let col = 0; col < rank; col++) {
    let s = 0;
    for (let row = 0; row <= col; row++) s += rinv[row * rank + col] * (xbar[f.kept[row]] / f.scale[f.kept[row]]);
    u[col] = s;
  }
  return { slopeVariance, interceptVariance: 1 / wsum + dot(u, u) };
}

function invertUpper(r: Float64Array, m: number): Float64Array {
  const inv = new Float64Array(m * m);
  for (let col = m - 1; col >= 0; col--) {
    inv[col * m + col] = 1 / r[col * m + col];
    for (let row = col - 1; row >= 0; row--) {
      let s = 0;
      for (let k = row + 1; k <= col; k++) s += r[row * m + k] * inv[k * m + col];
      inv[row * m + col] = -s / r[row * m + row];
    }
  }
  return inv;
}
