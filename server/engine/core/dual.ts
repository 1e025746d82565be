import { SemidefiniteSolver } from './gram';
import { blockConjugate } from './penalty';
import type { Problem } from './problem';

/**
 * The exact duality gap (Fenchel dual; see e.g. Ndiaye et al. 2017, "Gap Safe screening rules for
 * sparsity enforcing penalties", JMLR 18, section 2). With theta = -grad of the loss in eta / 1 (a
 * vector of length n):
 *   gaussian: D(theta) = yc'theta - n/2 ||theta||^2 - sum_u P_u*(X_u'theta)
 *   binomial: D(theta) = -(1/n) sum [s log s + (1-s) log(1-s)] - sum_u P_u*(X_u'theta), s = y - n theta
 * The dual point must satisfy: 1'theta = 0 (the intercept), X_U'theta = 0 (unpenalized columns; all
 * columns when lambda = 0), ||X_u'theta|| <= lambda w_u (alpha = 1) and, binomial, s in [0, 1].
 * It is built from the residual theta_raw at the current b: projected on those equality constraints
 * (through G_UU, the Gram block of the unpenalized columns), then moved towards a feasible anchor
 * (0 for gaussian; a shrunk multiple of the null model's dual point for binomial, which lies strictly
 * inside the box) just far enough to satisfy the inequalities. The gap P(b) - D(theta) >= 0 vanishes
 * at the solution; the solver stops when gap / nullObjective <= tolerance.
 */
export interface DualInput {
  lambda: number;
  /** Blocks whose constraints and conjugates are counted (the working set, or all). */
  blocks: Int32Array;
  /** X'theta_raw, column-indexed (entries of the scope's columns are read). */
  g: Float64Array;
  /** Loss value and lambda * P(b) at the current point. */
  loss: number;
  penalty: number;
  /** gaussian: yc'theta_raw. */
  ycTheta: number;
  /** binomial: theta_raw (length n). */
  theta: Float64Array | null;
}

export interface DualResult {
  /** Absolute gap P - D. */
  gap: number;
  /** X'theta at the dual point, column-indexed over the scope (for Gap Safe screening). */
  a: Float64Array;
}

export class DualContext {
  private readonly fixedU: Int32Array;
  private readonly solvers = new Map<string, SemidefiniteSolver>();
  private readonly a: Float64Array;
  private readonly delta: Float64Array;
  private readonly thetaP: Float64Array;

  constructor(
    private readonly problem: Problem,
    /** binomial: (y - p_null)/n and X' of it, at the null model (intercept and U fitted). */
    private readonly thetaNull: Float64Array | null,
    private readonly gNull: Float64Array,
    private readonly lambdaMax: number,
  ) {
    const pen = problem.penalty;
    const u: number[] = [];
    for (let b = 0; b < pen.nBlocks; b++) {
      if (pen.weight[b] === 0) for (let i = pen.start[b]; i < pen.start[b + 1]; i++) u.push(pen.features[i]);
    }
    this.fixedU = Int32Array.from(u);
    this.a = new Float64Array(problem.p);
    this.delta = new Float64Array(problem.p);
    this.thetaP = new Float64Array(problem.n);
  }

  /** Columns held to X_U'theta = 0: the unpenalized ones, or every column when lambda = 0. */
  unpenalized(lambda: number): Int32Array {
    return lambda > 0 ? this.fixedU : this.problem.penalty.features;
  }

  private solverFor(features: Int32Array): SemidefiniteSolver {
    const key = features === this.fixedU ? 'fixed' : 'all';
    let solver = this.solvers.get(key);
    if (!solver) {
      const m = features.length;
      const matrix = new Float64Array(m * m);
      for (let b = 0; b < m; b++) {
        const col = this.problem.gram.column(features[b]);
        for (let a = 0; a < m; a++) matrix[b * m + a] = col[features[a]];
      }
      solver = new SemidefiniteSolver(matrix, m);
      this.solvers.set(key, solver);
    }
    return solver;
  }

  gap(input: DualInput): DualResult {
    const { problem } = this;
    const pen = problem.penalty;
    const { lambda, blocks, g } = input;
    const { n } = problem;
    const a = this.a;
    const alpha = pen.alpha;
    // Project theta_raw: a = g - G[:, U] delta, delta = G_UU^{-1} g_U.
    for (let b = 0; b < blocks.length; b++) {
      const u = blocks[b];
      for (let i = pen.start[u]; i < pen.start[u + 1]; i++) a[pen.features[i]] = g[pen.features[i]];
    }
    const uCols = this.unpenalized(lambda);
    const m = uCols.length;
    let ycShift = 0;
    let normShift = 0;
    const delta = this.delta;
    if (m > 0) {
      const gU = new Float64Array(m);
      for (let b = 0; b < m; b++) gU[b] = g[uCols[b]];
      this.solverFor(uCols).solve(gU, delta);
      for (let b = 0; b < m; b++) {
        const coef = delta[b];
        if (coef === 0) continue;
        const col = problem.gram.column(uCols[b]);
        for (let bb = 0; bb < blocks.length; bb++) {
          const u = blocks[bb];
          for (let i = pen.start[u]; i < pen.start[u + 1]; i++) a[pen.features[i]] -= coef * col[pen.features[i]];
        }
        ycShift += problem.c[uCols[b]] * coef;
        normShift += gU[b] * coef;
      }
    }

    if (problem.family === 'gaussian') {
      const A = input.ycTheta - ycShift;
      const B = (2 * input.loss) / n - normShift / n;
      let tau = 1;
      if (alpha >= 1 && lambda > 0) {
        for (let b = 0; b < blocks.length; b++) {
          const u = blocks[b];
          if (pen.weight[u] === 0) continue;
          const norm = normOf(pen.start, pen.features, u, a);
          if (norm > lambda * pen.weight[u]) tau = Math.min(tau, (lambda * pen.weight[u]) / norm);
        }
      }
      let conj = 0;
      if (alpha < 1 && lambda > 0) {
        for (let b = 0; b < blocks.length; b++) {
          const u = blocks[b];
          if (pen.weight[u] > 0) conj += blockConjugate(tau * normOf(pen.start, pen.features, u, a), lambda, pen.weight[u], alpha);
        }
      }
      const dual = tau * A - (n / 2) * tau * tau * Math.max(B, 0) - conj;
      scaleScope(pen.start, pen.features, blocks, a, tau, null, 0);
      return { gap: input.loss + input.penalty - dual, a };
    }
    return this.binomialGap(input, uCols, m);
  }

  private binomialGap(input: DualInput, uCols: Int32Array, m: number): DualResult {
    const { problem, a, delta } = this;
    const pen = problem.penalty;
    const { lambda, blocks } = input;
    const { n, x, y } = problem;
    const theta = input.theta as Float64Array;
    const thetaP = this.thetaP;
    let mean = 0;
    for (let i = 0; i < n; i++) mean += theta[i];
    mean /= n;
    for (let i = 0; i < n; i++) thetaP[i] = theta[i] - mean;
    for (let b = 0; b < m; b++) {
      const coef = delta[b] / n;
      if (coef === 0) continue;
      const off = uCols[b] * n;
      for (let i = 0; i < n; i++) thetaP[i] -= coef * x[off + i];
    }
    // Anchor: kappa * theta_null with kappa < 1 keeps s strictly inside (0, 1) and every block
    // strictly feasible (||kappa X_u'theta_null|| <= kappa lambda_max w_u < lambda w_u).
    const kappa = lambda > 0 && this.thetaNull ? 0.5 * Math.min(1, lambda / this.lambdaMax) : 0;
    const anchor = this.thetaNull;
    let tau = 1;
    for (let i = 0; i < n; i++) {
      const base = kappa * (anchor ? anchor[i] : 0);
      const e = n * (thetaP[i] - base);
      if (e > 0) tau = Math.min(tau, (y[i] - n * base) / e);
      else if (e < 0) tau = Math.min(tau, (y[i] - 1 - n * base) / e);
    }
    if (pen.alpha >= 1 && lambda > 0) {
      for (let b = 0; b < blocks.length; b++) {
        const u = blocks[b];
        if (pen.weight[u] === 0) continue;
        tau = Math.min(tau, blockStep(pen.start, pen.features, u, a, this.gNull, kappa, lambda * pen.weight[u]));
      }
    }
    tau = Math.max(0, tau);
    let entropy = 0;
    for (let i = 0; i < n; i++) {
      const base = kappa * (anchor ? anchor[i] : 0);
      const s = y[i] - n * (base + tau * (thetaP[i] - base));
      if (s > 0 && s < 1) entropy += s * Math.log(s) + (1 - s) * Math.log1p(-s);
    }
    scaleScope(pen.start, pen.features, blocks, a, tau, this.gNull, kappa);
    let conj = 0;
    if (pen.alpha < 1 && lambda > 0) {
      for (let b = 0; b < blocks.length; b++) {
        const u = blocks[b];
        if (pen.weight[u] > 0) conj += blockConjugate(normOf(pen.start, pen.features, u, a), lambda, pen.weight[u], pen.alpha);
      }
    }
    const dual = -entropy / n - conj;
    return { gap: input.loss + input.penalty - dual, a };
  }
}

function normOf(start: Int32Array, features: Int32Array, u: number, v: Float64Array): number {
  let sq = 0;
  for (let i = start[u]; i < start[u + 1]; i++) sq += v[features[i]] * v[features[i]];
  return Math.sqrt(sq);
}

/** a <- kappa gNull + tau (a - kappa gNull) on the scope's columns. */
function scaleScope(
  start: Int32Array,
  features: Int32Array,
  blocks: Int32Array,
  a: Float64Array,
  tau: number,
  gNull: Float64Array | null,
  kappa: number,
): void {
  for (let b = 0; b < blocks.length; b++) {
    const u = blocks[b];
    for (let i = start[u]; i < start[u + 1]; i++) {
      const j = features[i];
      const base = gNull ? kappa * gNull[j] : 0;
      a[j] = base + tau * (a[j] - base);
    }
  }
}

/** Largest tau in [0, 1] with ||base + tau (a - base)|| <= radius, base = kappa gNull (feasible). */
function blockStep(
  start: Int32Array,
  features: Int32Array,
  u: number,
  a: Float64Array,
  gNull: Float64Array,
  kappa: number,
  radius: number,
): number {
  let dd = 0;
  let bd = 0;
  let bb = 0;
  for (let i = start[u]; i < start[u + 1]; i++) {
    const j = features[i];
    const base = kappa * gNull[j];
    const d = a[j] - base;
    dd += d * d;
    bd += base * d;
    bb += base * base;
  }
  const endSq = dd + 2 * bd + bb;
  if (endSq <= radius * radius || dd === 0) return 1;
  const c = bb - radius * radius;
  const root = (-bd + Math.sqrt(Math.max(0, bd * bd - dd * c))) / dd;
  return Math.min(1, Math.max(0, root));
}
