/**
 * The engine's public types: the contract between the numerical core and everything that calls it
 * (CLI, fit workers, tests, benchmarks). Objectives and scalings (docs/engine.md):
 *
 *   gaussian: 1/(2n) sum (y_i - b0 - x_i'b)^2 + lambda * P(b)
 *   binomial: -(1/n) sum [y_i eta_i - log(1 + exp(eta_i))] + lambda * P(b),  eta_i = b0 + x_i'b
 *   lasso P(b) = sum_j v_j |b_j|;  elastic net P(b) = sum_j v_j (a |b_j| + (1 - a)/2 b_j^2), a = l1Share
 *   group lasso P(b) = sum_g w_g ||b_g||_2, w_g = sqrt(|g|) by default.
 */

export type Family = 'gaussian' | 'binomial';
export type PenaltyKind = 'lasso' | 'elastic-net' | 'group-lasso';
export type SolveStatus = 'converged' | 'iteration-limit' | 'numerical-failure';
export type Screening = 'strong' | 'gap-safe' | 'none';

/** A column as the engine receives it. Missing values: NaN (numeric) or code -1 (categorical). */
export type EngineColumn =
  | { name: string; kind: 'numeric'; values: Float64Array }
  | { name: string; kind: 'categorical'; codes: Int32Array; levels: string[] };

/** A table of raw columns (before encoding). Every column has nRows entries. */
export interface EngineTable {
  nRows: number;
  columns: EngineColumn[];
}

/**
 * A dense design matrix after encoding, column-major: column j is x.subarray(j * n, (j + 1) * n).
 * `terms[j]` names column j: the predictor's name, or `column=level` for a categorical indicator.
 */
export interface DesignMatrix {
  n: number;
  p: number;
  x: Float64Array;
  terms: string[];
}

export interface FitSpec {
  family: Family;
  response: string;
  /** Predictor column names (before encoding). */
  predictors: string[];
  penalty: PenaltyKind;
  /** Elastic-net L1 share a in (0, 1] (1 = lasso, towards 0 = ridge); required for elastic net, absent otherwise. */
  l1Share?: number;
  /** Group lasso: group name -> column names (categorical predictors form a group on their own). */
  groups?: Record<string, string[]>;
  /** Per-term (or per-predictor) penalty weights v_j; default 1, 0 = unpenalized. */
  penaltyWeights?: Record<string, number>;
  standardize: boolean;
  /** Explicit descending lambdas; otherwise the automatic grid below. */
  lambda?: number[];
  pathLength: number;
  /** The automatic path ends at lambda_max * 10^-pathDecades (default DEFAULT_PATH_DECADES). */
  pathDecades?: number;
  /**
   * End the automatic path after the first lambda whose model has more than maxTerms nonzero terms;
   * not with explicit lambdas.
   */
  maxTerms?: number;
  tolerance: number;
  maxIterations: number;
  screening: Screening;
  /** Rows with a missing value in a used column: dropped, or mean/mode imputed. */
  missing: 'drop' | 'impute';
  /** Cross-validation; null for none. */
  cv: CvSpec | null;
}

export interface CvSpec {
  folds: number;
  seed: number;
  /** Integer fold ids from this column (not a predictor); overrides `folds` and `seed`. */
  foldColumn?: string;
}

/** STYLE.md 9: every solve returns its status, gap, tolerance, iterations and time. */
export interface SolveInfo {
  status: SolveStatus;
  message: string;
  /** Duality gap relative to the null-model objective at the returned point. */
  gap: number;
  tolerance: number;
  /** FISTA iterations plus the active-set polish's linear solves and Newton steps (both limited). */
  iterations: number;
  timeMs: number;
  /**
   * What ended the solve: 'warm-start' (the previous solution already met the tolerance), 'polish'
   * (the active-set polish's point met it), 'gap' (a FISTA iterate met it), 'factorization' (lambda =
   * 0: the unpenalized fit), 'iteration-limit' or 'numerical-failure'.
   */
  stoppedBy: StopRule;
}

export type StopRule = 'warm-start' | 'polish' | 'gap' | 'factorization' | 'iteration-limit' | 'numerical-failure';

export interface PathResult {
  family: Family;
  terms: string[];
  lambda: number[];
  lambdaMax: number;
  /** Original scale, one entry per lambda. */
  intercept: number[];
  coefficients: Float64Array[];
  /** Standardized scale (equal to the original scale when standardization is off). */
  standardizedIntercept: number[];
  standardizedCoefficients: Float64Array[];
  solves: SolveInfo[];
  /** Number of non-zero coefficients per lambda. */
  nonzero: number[];
  /** Fraction of the null deviance explained, per lambda: 1 - deviance / null deviance. */
  devianceExplained: number[];
  /** Constant columns left out, rows dropped for missing values, etc. */
  notes: string[];
  /**
   * The standardization learnt from the rows fitted: standardized column j = (x_j - centers[j]) /
   * scales[j]. scales[j] = 1 when standardization is off; constant columns have scale 0 and
   * coefficient 0.
   */
  centers?: Float64Array;
  scales?: Float64Array;
  /** Set by fitPath (table level): how predictors map to design columns. */
  encoding?: DesignEncoding;
  /** Relative-gap convention: gap / nullObjective, the objective at b = 0 with the best intercept. */
  nullObjective?: number;
}

/**
 * Options of one path fit on an already-encoded design (fitPathOnDesign). Standardization is learnt
 * inside the fit from the rows it is given (so cross-validation learns it on training rows only).
 */
export interface PathOptions {
  family: Family;
  penalty: PenaltyKind;
  /** Elastic-net L1 share in (0, 1]; required for elastic net, absent for the lasso and group lasso. */
  l1Share?: number;
  /** Group lasso: group id (0..G-1) of each design column; default every column its own group. */
  groupOfTerm?: ArrayLike<number>;
  /** Group lasso: weight per group; default sqrt(group size). 0 = unpenalized group. */
  groupWeights?: ArrayLike<number>;
  /** Penalty factor v_j per design column; default 1, 0 = unpenalized. */
  penaltyWeights?: ArrayLike<number>;
  standardize: boolean;
  /** Explicit descending lambdas (e.g. the full-data grid passed to each fold). */
  lambda?: number[];
  /** Automatic grid length (default DEFAULT_PATH_LENGTH). */
  pathLength?: number;
  /** The automatic grid ends at lambda_max * 10^-pathDecades (default DEFAULT_PATH_DECADES). */
  pathDecades?: number;
  /** Relative duality gap target (gap / null-model objective); default DEFAULT_TOLERANCE. */
  tolerance?: number;
  /** FISTA iteration limit per lambda; default DEFAULT_MAX_ITERATIONS. */
  maxIterations?: number;
  /** Default 'strong'. */
  screening?: Screening;
  /**
   * End the automatic path after the first lambda whose model has more than maxTerms nonzero terms
   * (that lambda is kept). Ignored with explicit lambdas (so cross-validation folds fit the whole
   * full-data grid). Default: no limit.
   */
  maxTerms?: number;
  /** Called after each lambda is solved (fit workers report live progress with it). */
  onLambda?: (done: number, total: number) => void;
  /** Gaussian only: 'auto' (default) uses the Gram matrix X'X/n when n >= 2p and p <= 2000. */
  gram?: 'auto' | 'always' | 'never';
  /**
   * Gaussian, Gram form only: cross products of exactly these rows about a fixed centre (see
   * crossProducts / subtractCrossProducts), from which the Gram matrix is formed instead of from X:
   * for cross-validation, S(training rows) = S(all rows) - S(held-out rows).
   */
  crossProducts?: CrossProducts;
  /**
   * Lasso and elastic net: finish each solve with the active-set polish (exact solve on the support,
   * core/polish.ts, docs/decisions/0014-active-set-polish.md); default true. false leaves FISTA alone (for comparisons and tests).
   */
  polish?: boolean;
}

/** sum_i (x_i - center)(x_i - center)' over `rows` rows (p x p, row-major). */
export interface CrossProducts {
  rows: number;
  center: Float64Array;
  sums: Float64Array;
  /** sum_i (x_i - center): the rows' means follow (center + colSums / rows). */
  colSums?: Float64Array;
  /** The response's sums about its own centre: sum (y - cy), sum (x - c)(y - cy), sum (y - cy)^2. */
  response?: { center: number; sum: number; cross: Float64Array; squares: number };
}

/** How one predictor column becomes design columns (for applying a stored fit to new rows). */
export type TermEncoding =
  | { column: string; kind: 'numeric'; term: number; imputeValue?: number }
  | {
      column: string;
      kind: 'categorical';
      /** levels[k] -> design column terms[k] (indicator `column=level`). */
      levels: string[];
      terms: number[];
      imputeLevel?: string;
    };

export interface DesignEncoding {
  columns: TermEncoding[];
  /** Binomial with a two-level categorical response: [level mapped to 0, level mapped to 1]. */
  responseLevels?: [string, string];
}

export type CvMetricName = 'mse' | 'mae' | 'deviance' | 'misclassification' | 'auc';

export interface CvCurve {
  metric: CvMetricName;
  mean: number[];
  standardError: number[];
}

export interface CvResult {
  folds: number;
  /** The metric used for the choices: mse (gaussian) or deviance (binomial). */
  metric: CvMetricName;
  mean: number[];
  standardError: number[];
  minimum: { index: number; lambda: number };
  oneStandardError: { index: number; lambda: number };
  /** Every metric computed (gaussian: mse, mae; binomial: deviance, misclassification, auc). */
  curves: CvCurve[];
  /** Fold id (0-based) of each used row. */
  foldIds: Int32Array;
}

/** A user-facing input error: the message names the column, row, option or value at fault. */
export class EngineInputError extends Error {
  constructor(
    message: string,
    readonly field?: string,
  ) {
    super(message);
    this.name = 'EngineInputError';
  }
}
