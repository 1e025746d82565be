import type { Family } from '../../types';
import type { Tangent } from '../pathTangent';
import type { WorkingSet } from '../problem';
import type { SupportSystem } from '../supportSystem';

/**
 * The loss role (as penalty.ts is the penalty role): one object per family and form that the
 * solver, the full check, the dual, the polish and the null fit ask instead of branching on the
 * family. Forms: 'design' works on X (images of length n); 'gram' (gaussian only) works on
 * G = X'X/n and c = X'y/n (images of the working-set size). Registered in ./index.ts.
 */
export interface LossRole {
  readonly family: Family;
  readonly form: 'design' | 'gram';
  /** Working vectors carry an intercept slot after the coefficients (the gaussian intercept is closed-form). */
  readonly intercept: boolean;
  /** Strong concavity of the dual in theta (Gap Safe sphere radius sqrt(2 gap / gamma)). */
  readonly dualConcavity: number;
  /** Objective at b = 0 with the best intercept (the relative gap's scale). */
  readonly nullObjective: number;
  /**
   * The solver polishes a warm start before computing its gap (fista's SolverOptions.polishFirst):
   * set by losses whose solves along a path end at the polish anyway (binomial, decision 25).
   */
  readonly polishFirst?: boolean;
  /** Value, gradient and Lipschitz bound on a working set (what FISTA needs). */
  bind(ws: WorkingSet): BoundLoss;
  /**
   * Loss, X'theta_raw (= -gradient) over every column, and the dual residual, at (coef, intercept).
   * `image`, when given, is the solver's image of the same point (binomial: b0 + X b); a loss may use
   * it instead of computing X b again.
   */
  evaluate(coef: Float64Array, intercept: number, image?: Float64Array): Evaluation;
  /**
   * Design forms whose dual ignores a block with |X_u'theta| < lambda alpha w_u (gaussian): the loss,
   * theta_raw = -d loss / d eta (length n) and the dual residual at (coef, intercept), without
   * X'theta, so the full check computes only the columns it needs (path/check.ts, KktBounds).
   * `image`, when given, is X b already computed (the solver's image of the same point).
   */
  residualAt?(coef: Float64Array, intercept: number, image?: Float64Array): ResidualPoint;
  /** The null model: penalized coefficients 0, the intercept and the unpenalized columns U at their optimum. */
  nullFit(unpenalized: Int32Array, memory: SupportMemory): NullFit;
  /**
   * The dual point and its objective: from the projected residual (dual.ts), the largest step
   * tau towards the feasible anchor, the dual value D there (conjugates included); scales the
   * projected X'theta in `projection.a` to the dual point. Returns D.
   */
  dual(projection: DualProjection): number;
  /**
   * The smooth problem on a fixed support and signs (the active-set polish, polish.ts): writes its
   * minimizer into `out`; `steps` counts linear solves or Newton steps.
   */
  solveOnSupport(support: SupportProblem, out: Float64Array, maxSteps: number, memory: SupportMemory): { ok: boolean; steps: number };
  /**
   * x_j'theta (= -gradient) at `w`, whose non-zeros are among `active`, for every working column off
   * `active` (the entries of `active` are left unspecified: the polish does not read them).
   */
  negativeGradient(ws: WorkingSet, active: number[], w: Float64Array, memory?: SupportMemory): Float64Array;
}

export interface BoundLoss {
  imageSize: number;
  /** The solver's linear image of w: eta = X_W w (+ intercept) for the design form, G_WW w for the Gram form. */
  image(w: Float64Array, out: Float64Array): void;
  value(img: Float64Array, w: Float64Array): number;
  gradient(img: Float64Array, w: Float64Array, out: Float64Array): void;
  /** gradient() on the working positions positions[0..count) only (others untouched), when the loss has it. */
  gradientOn?(img: Float64Array, w: Float64Array, out: Float64Array, positions: Int32Array, count: number): void;
  /** An estimate of the gradient's Lipschitz constant (backtracking corrects an underestimate). */
  lipschitz(): number;
  /** What the dual needs from the current point besides X'theta (gradient() gives that). */
  residual(img: Float64Array, w: Float64Array): DualResidual;
}

/**
 * LossRole.residualAt's answer: the loss, theta_raw, the dual residual, and the image X b it came
 * from (given, or computed when not given).
 */
export interface ResidualPoint {
  loss: number;
  theta: Float64Array;
  residual: DualResidual;
  image: Float64Array;
}

/** gaussian: yc'theta_raw (theta null); binomial: theta_raw itself (length n). */
export interface DualResidual {
  ycTheta: number;
  theta: Float64Array | null;
}

export interface Evaluation {
  loss: number;
  g: Float64Array;
  residual: DualResidual;
}

export interface NullFit {
  /** Standardized-scale coefficients: non-zero only on unpenalized columns. */
  coef: Float64Array;
  /** binomial intercept (gaussian: unused, the intercept is mean(y) on centred columns). */
  intercept: number;
  /** X'theta at the null model, theta = -d loss / d eta (column-indexed): lambda_max comes from it. */
  g: Float64Array;
  /** binomial: theta = (y - p_null)/n. */
  theta: Float64Array | null;
}

/** What DualContext hands the loss after projecting on the equality constraints (dual.ts). */
export interface DualProjection {
  lambda: number;
  blocks: Int32Array;
  /** X'theta projected (scope columns); scaled in place to the dual point. */
  a: Float64Array;
  loss: number;
  residual: DualResidual;
  /** Unpenalized (or, at lambda = 0, all) columns and G_UU^{-1} X_U'theta_raw. */
  uCols: Int32Array;
  delta: Float64Array;
  ycShift: number;
  normShift: number;
  /** The null model's dual point (theta null for gaussian, whose anchor is 0), X' of it, and lambda_max. */
  nullPoint: { theta: Float64Array | null; g: Float64Array; lambdaMax: number };
}

/** Sign code of a coefficient without sign constraint (unpenalized, or lambda = 0). */
export const FREE = 2;

/** A fixed support with signs (polish.ts): FREE marks an unpenalized or lambda = 0 coefficient. */
export interface SupportProblem {
  ws: WorkingSet;
  active: number[];
  sign: Int8Array;
  l1: Float64Array;
  l2: Float64Array;
  lambda: number;
  /** The relative duality gap the solve asks for (absent: as accurate as the solve can be). */
  tolerance?: number;
}

/**
 * What the polish carries from one lambda to the next along one path (path state, not module
 * state): the gaussian support system's factor, and the last Newton solution's tangent.
 */
export interface SupportMemory {
  system?: SupportSystem;
  tangent?: Tangent;
  /**
   * The last negativeGradient of a loss that records it (gaussian design form): the point w, its
   * image X w, and x_b'theta at the positions b with known[b] (those off the support).
   */
  last?: { w: Float64Array; image: Float64Array; known: Uint8Array; values: Float64Array };
}
