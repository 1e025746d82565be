import { SemidefiniteSolver } from './gram';
import type { DualResidual } from './loss';
import type { Problem } from './problem';

/**
 * The exact duality gap (Fenchel dual; see e.g. Ndiaye et al. 2017, "Gap Safe screening rules for
 * sparsity enforcing penalties", JMLR 18, section 2). With theta = -grad of the loss in eta / 1 (a
 * vector of length n):
 *   gaussian: D(theta) = yc'theta - n/2 ||theta||^2 - sum_u P_u*(X_u'theta)
 *   binomial: D(theta) = -(1/n) sum [s log s + (1-s) log(1-s)] - sum_u P_u*(X_u'theta), s = y - n theta
 * The dual point must satisfy: 1'theta = 0 (the intercept), X_U'theta = 0 (unpenalized columns; all
 * columns when lambda = 0), ||X_u'theta|| <= lambda w_u (alpha = 1) and, binomial, s in [0, 1].
 * It is built from the residual theta_raw at the current b: projected here on those equality
 * constraints (through G_UU, the Gram block of the unpenalized columns), then the loss (loss/*.ts,
 * `dual`) moves it towards a feasible anchor (0 for gaussian; a shrunk multiple of the null model's
 * dual point for binomial, which lies strictly inside the box) just far enough to satisfy the
 * inequalities, and evaluates D there. The gap P(b) - D(theta) >= 0 vanishes at the solution; the
 * solver stops when gap / nullObjective <= tolerance.
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
  /** What the loss's dual needs besides X'theta_raw (LossRole.evaluate / BoundLoss.residual). */
  residual: DualResidual;
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
  private readonly nullPoint: { theta: Float64Array | null; g: Float64Array; lambdaMax: number };

  constructor(
    private readonly problem: Problem,
    /** binomial: (y - p_null)/n and X' of it, at the null model (intercept and U fitted). */
    thetaNull: Float64Array | null,
    gNull: Float64Array,
    lambdaMax: number,
  ) {
    this.nullPoint = { theta: thetaNull, g: gNull, lambdaMax };
    const pen = problem.penalty;
    const u: number[] = [];
    for (let b = 0; b < pen.nBlocks; b++) {
      if (pen.weight[b] === 0) for (let i = pen.start[b]; i < pen.start[b + 1]; i++) u.push(pen.features[i]);
    }
    this.fixedU = Int32Array.from(u);
    this.a = new Float64Array(problem.p);
    this.delta = new Float64Array(problem.p);
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
    const a = this.a;
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

    const dual = problem.loss.dual({
      lambda,
      blocks,
      a,
      loss: input.loss,
      residual: input.residual,
      uCols,
      delta,
      ycShift,
      normShift,
      nullPoint: this.nullPoint,
    });
    return { gap: input.loss + input.penalty - dual, a };
  }
}
