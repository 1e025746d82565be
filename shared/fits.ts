/**
 * Fits: version 1, 2, ... of a model. The request body of a run (the fit spec, one zod schema for
 * the client's form and the server), the statuses, and the response shapes of the fits API.
 * Names follow the shared vocabulary: l1Share, penaltyWeights, pathLength, pathDecades, maxTerms,
 * tolerance, devianceExplained.
 */
import { z } from 'zod';
import type { UserRef } from './datasets';
import { columnNameSchema, type FitFamily } from './models';

// ---- limits -------------------------------------------------------------------------------------
export const MAX_PREDICTORS = 20_000;
export const MAX_GROUPS = 5_000;
export const MIN_PATH_LENGTH = 2;
export const MAX_PATH_LENGTH = 500;
export const DEFAULT_PATH_LENGTH = 100;
export const MIN_PATH_DECADES = 0.5;
export const MAX_PATH_DECADES = 10;
export const MAX_EXPLICIT_LAMBDAS = 500;
export const MIN_FOLDS = 2;
export const MAX_FOLDS = 50;
export const DEFAULT_FOLDS = 10;
export const DEFAULT_SEED = 1;
export const MAX_SEED = 2 ** 31 - 1;
export const MIN_HOLDOUT_SHARE = 0.05;
export const MAX_HOLDOUT_SHARE = 0.5;
export const MIN_TOLERANCE = 1e-14;
export const MAX_TOLERANCE = 1e-2;
export const MAX_ITERATIONS_LIMIT = 1_000_000;
export const MAX_PENALTY_WEIGHT = 1e6;

// ---- the spec -----------------------------------------------------------------------------------
export const PENALTIES = ['lasso', 'elastic-net', 'group-lasso'] as const;
export type FitPenalty = (typeof PENALTIES)[number];
export const PENALTY_LABELS: Record<FitPenalty, string> = {
  lasso: 'Lasso',
  'elastic-net': 'Elastic net',
  'group-lasso': 'Group lasso',
};

/** Held-out error measures. Lower is better except auc (higher is better). */
export const CV_METRICS = ['mse', 'mae', 'deviance', 'misclassification', 'auc'] as const;
export type CvMetric = (typeof CV_METRICS)[number];
export const CV_METRICS_BY_FAMILY: Record<FitFamily, readonly CvMetric[]> = {
  gaussian: ['mse', 'mae'],
  binomial: ['deviance', 'misclassification', 'auc'],
};
export const CV_METRIC_LABELS: Record<CvMetric, string> = {
  mse: 'Mean squared error',
  mae: 'Mean absolute error',
  deviance: 'Deviance',
  misclassification: 'Misclassification rate',
  auc: 'AUC',
};

export const MISSING_POLICIES = ['drop', 'impute'] as const;
export type MissingPolicy = (typeof MISSING_POLICIES)[number];
export const MISSING_POLICY_LABELS: Record<MissingPolicy, string> = {
  drop: 'Leave out rows with a missing value',
  impute: 'Fill gaps with the mean (numbers) or most common level',
};

const seedSchema = z
  .number({ error: 'Enter a whole-number seed.' })
  .int('Enter a whole-number seed.')
  .min(0, 'The seed is at least 0.')
  .max(MAX_SEED, `The seed is at most ${MAX_SEED}.`);

/** How the lambdas are laid out: Lariat's automatic path, or the analyst's own list. */
export const pathSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({
      kind: z.literal('automatic'),
      pathLength: z
        .number()
        .int('Enter a whole number of lambdas.')
        .min(MIN_PATH_LENGTH, `At least ${MIN_PATH_LENGTH} lambdas.`)
        .max(MAX_PATH_LENGTH, `At most ${MAX_PATH_LENGTH} lambdas.`)
        .default(DEFAULT_PATH_LENGTH),
      /** The path runs from lambda_max down to lambda_max * 10^-pathDecades; absent: the engine's default. */
      pathDecades: z
        .number()
        .min(MIN_PATH_DECADES, `At least ${MIN_PATH_DECADES} decades.`)
        .max(MAX_PATH_DECADES, `At most ${MAX_PATH_DECADES} decades.`)
        .optional(),
      /** End the path after the first lambda with more than this many nonzero terms. */
      maxTerms: z.number().int('Enter a whole number of terms.').min(1, 'At least 1 term.').optional(),
    }),
    z.strictObject({
      kind: z.literal('explicit'),
      lambdas: z
        .array(z.number().positive('Each lambda is greater than 0.').finite())
        .min(1, 'Give at least one lambda.')
        .max(MAX_EXPLICIT_LAMBDAS, `At most ${MAX_EXPLICIT_LAMBDAS} lambdas.`)
        .refine((l) => l.every((v, i) => i === 0 || v < l[i - 1]), 'List the lambdas from largest to smallest, without repeats.'),
    }),
  ],
  { error: () => 'Choose an automatic path or a list of lambdas.' },
);
export type PathInput = z.input<typeof pathSchema>;

/** Cross-validation: none, K seeded folds (stratified by class for binomial), or fold ids from a column. */
export const cvSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('none') }),
    z.strictObject({
      kind: z.literal('folds'),
      folds: z
        .number()
        .int('Enter a whole number of folds.')
        .min(MIN_FOLDS, `At least ${MIN_FOLDS} folds.`)
        .max(MAX_FOLDS, `At most ${MAX_FOLDS} folds.`)
        .default(DEFAULT_FOLDS),
      seed: seedSchema.default(DEFAULT_SEED),
    }),
    z.strictObject({ kind: z.literal('column'), column: columnNameSchema }),
  ],
  { error: () => 'Choose no cross-validation, a number of folds, or a fold column.' },
);
export type CvInput = z.input<typeof cvSchema>;

export const holdoutSchema = z.strictObject({
  share: z
    .number()
    .min(MIN_HOLDOUT_SHARE, `Hold out at least ${MIN_HOLDOUT_SHARE * 100}% of the rows.`)
    .max(MAX_HOLDOUT_SHARE, `Hold out at most ${MAX_HOLDOUT_SHARE * 100}% of the rows.`),
  seed: seedSchema.default(DEFAULT_SEED),
});

/**
 * POST /api/workspaces/:workspaceId/models/:modelId/fits. The outcome and family come from the
 * model. Cross-field rules live in the superRefine so the form shows them beside the field (path
 * in `issue.path`); the server checks the columns against the dataset version besides.
 */
export const fitRequestSchema = z
  .strictObject({
    /** Absent: the latest version of the model's dataset. A replaced (not latest) version is refused. */
    datasetVersionId: z.uuid('datasetVersionId must be a dataset version id').optional(),
    predictors: z
      .array(columnNameSchema)
      .min(1, 'Choose at least one predictor.')
      .max(MAX_PREDICTORS, `At most ${MAX_PREDICTORS} predictors.`),
    penalty: z.enum(PENALTIES, { error: () => `Choose one of: ${PENALTIES.join(', ')}.` }),
    /** Elastic net only, required there: the L1 share in (0, 1]; 1 = lasso. */
    l1Share: z.number().gt(0, 'The L1 share is greater than 0.').max(1, 'The L1 share is at most 1.').optional(),
    /** Group lasso only: group name -> predictor columns. Predictors in no group form groups of their own. */
    groups: z.record(z.string().min(1).max(200), z.array(columnNameSchema).min(1, 'A group needs a column.')).optional(),
    standardize: z.boolean().default(true),
    path: pathSchema.default({ kind: 'automatic', pathLength: DEFAULT_PATH_LENGTH }),
    /** Per predictor column: default 1; 0 = always kept (unpenalized). */
    penaltyWeights: z
      .record(columnNameSchema, z.number().min(0, 'A penalty weight is at least 0.').max(MAX_PENALTY_WEIGHT))
      .optional(),
    cv: cvSchema.default({ kind: 'folds', folds: DEFAULT_FOLDS, seed: DEFAULT_SEED }),
    /** The measure the lambda choices use; absent: mse (gaussian) or deviance (binomial). */
    metric: z.enum(CV_METRICS).optional(),
    missing: z.enum(MISSING_POLICIES).default('drop'),
    /** Rows set aside before fitting, scored at the chosen lambda. */
    holdout: holdoutSchema.optional(),
    /** Relative duality gap; absent: the engine's default. */
    tolerance: z.number().min(MIN_TOLERANCE).max(MAX_TOLERANCE).optional(),
    maxIterations: z.number().int().min(10).max(MAX_ITERATIONS_LIMIT).optional(),
  })
  .superRefine((spec, ctx) => {
    if (spec.penalty === 'elastic-net' && spec.l1Share === undefined) {
      ctx.addIssue({ code: 'custom', path: ['l1Share'], message: 'Elastic net needs an L1 share between 0 and 1.' });
    }
    if (spec.penalty !== 'elastic-net' && spec.l1Share !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['l1Share'], message: 'The L1 share applies to elastic net only.' });
    }
    if (spec.penalty !== 'group-lasso' && spec.groups !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['groups'], message: 'Groups apply to the group lasso only.' });
    }
    if (spec.groups && Object.keys(spec.groups).length > MAX_GROUPS) {
      ctx.addIssue({ code: 'custom', path: ['groups'], message: `At most ${MAX_GROUPS} groups.` });
    }
    const predictors = new Set(spec.predictors);
    if (predictors.size !== spec.predictors.length) {
      ctx.addIssue({ code: 'custom', path: ['predictors'], message: 'A predictor is listed twice.' });
    }
    const owner = new Map<string, string>();
    for (const [group, columns] of Object.entries(spec.groups ?? {})) {
      for (const column of columns) {
        if (!predictors.has(column)) {
          ctx.addIssue({ code: 'custom', path: ['groups', group], message: `"${column}" in group "${group}" is not a chosen predictor.` });
        }
        const previous = owner.get(column);
        if (previous !== undefined) {
          ctx.addIssue({ code: 'custom', path: ['groups', group], message: `"${column}" is in both group "${previous}" and group "${group}".` });
        }
        owner.set(column, group);
      }
    }
    for (const column of Object.keys(spec.penaltyWeights ?? {})) {
      if (!predictors.has(column)) {
        ctx.addIssue({ code: 'custom', path: ['penaltyWeights', column], message: `"${column}" has a penalty weight but is not a chosen predictor.` });
      }
    }
    if (spec.cv.kind === 'column' && predictors.has(spec.cv.column)) {
      ctx.addIssue({ code: 'custom', path: ['cv', 'column'], message: `The fold column "${spec.cv.column}" cannot also be a predictor.` });
    }
    if (spec.metric !== undefined && spec.cv.kind === 'none') {
      ctx.addIssue({ code: 'custom', path: ['metric'], message: 'A cross-validation measure needs cross-validation.' });
    }
  });
export type FitRequestInput = z.input<typeof fitRequestSchema>;
export type FitRequest = z.output<typeof fitRequestSchema>;

/** The full stored spec of a version: the request with defaults filled, plus the model's question. */
export type FitSpec = Omit<FitRequest, 'datasetVersionId'> & {
  datasetVersionId: string;
  outcome: string;
  family: FitFamily;
};

/** Fields the server checks against the family (the form checks them too, knowing the model). */
export function familyIssues(spec: Pick<FitRequest, 'metric'>, family: FitFamily): { field: string; message: string }[] {
  if (spec.metric !== undefined && !CV_METRICS_BY_FAMILY[family].includes(spec.metric)) {
    return [{ field: 'metric', message: `For a ${family} model choose one of: ${CV_METRICS_BY_FAMILY[family].join(', ')}.` }];
  }
  return [];
}

/** POST .../fits/:fitId/choice: the lambda a fit reports (any index on the path, or a rule). */
export const chooseLambdaSchema = z.union([
  z.strictObject({ rule: z.enum(['minimum', 'one-standard-error']) }),
  z.strictObject({ index: z.number().int('Choose a lambda by its position.').min(0, 'Choose a lambda by its position.') }),
]);
export type ChooseLambdaInput = z.infer<typeof chooseLambdaSchema>;

/** GET .../fits/:fitId/predictions?datasetVersionId=... (or POST a CSV file as multipart `file`). */
export const predictionsQuerySchema = z.strictObject({
  datasetVersionId: z.uuid('datasetVersionId must be a dataset version id'),
});

// ---- statuses and responses ---------------------------------------------------------------------
/** waiting: queued, no worker yet. running. finished: results stored. failed: see message. cancelled. */
export const FIT_STATUSES = ['waiting', 'running', 'finished', 'failed', 'cancelled'] as const;
export type FitStatus = (typeof FIT_STATUSES)[number];
export const FIT_STATUS_LABELS: Record<FitStatus, string> = {
  waiting: 'Waiting for a worker',
  running: 'Running',
  finished: 'Finished',
  failed: 'Failed',
  cancelled: 'Cancelled',
};
export const ACTIVE_FIT_STATUSES: readonly FitStatus[] = ['waiting', 'running'];

/** What a running fit is doing now. */
export type FitStage = 'waiting' | 'path' | 'folds' | 'combining' | 'done';

/** GET .../fits/:fitId/progress (light; poll it while waiting or running). */
export interface FitProgressDto {
  id: string;
  status: FitStatus;
  stage: FitStage;
  /** Lambdas solved on the full-data path so far, of lambdaCount (known once the path starts). */
  lambdaIndex: number;
  lambdaCount: number | null;
  foldsDone: number;
  foldsTotal: number;
  /** Since the fit started running (0 while waiting). */
  elapsedMs: number;
  /** Estimate of the time left; null while unknown. */
  remainingMs: number | null;
  /** Fraction in [0, 1] for a progress bar. */
  fraction: number;
  message: string | null;
}

export interface DatasetVersionRef {
  id: string;
  datasetId: string;
  datasetName: string;
  number: number;
  sha256: string;
}

/** One version in lists. */
export interface FitSummaryDto {
  id: string;
  modelId: string;
  version: number;
  status: FitStatus;
  /** True when any lambda of the finished path (or a fold fit) stopped at its iteration limit or failed numerically. */
  unconverged: boolean;
  /** failed: what went wrong; cancelled: who cancelled. */
  message: string | null;
  datasetVersion: DatasetVersionRef;
  createdBy: UserRef;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

/** A sparse vector over the terms: `values[k]` belongs to term `terms[k]` (index into FitResultsDto.terms). */
export interface SparseTerms {
  terms: number[];
  values: number[];
}

/** The solver's certificate of one lambda (full-data path). */
export interface LambdaCertificateDto {
  /** Duality gap relative to the null-model objective. */
  gap: number;
  tolerance: number;
  iterations: number;
  status: 'converged' | 'iteration-limit' | 'numerical-failure';
  /** Plain words on why the solve stopped. */
  stoppingReason: string;
  timeMs: number;
}

export interface CvCurveDto {
  metric: CvMetric;
  mean: number[];
  standardError: number[];
}

export interface CvResultDto {
  folds: number;
  /** The measure used for the choices. */
  metric: CvMetric;
  mean: number[];
  standardError: number[];
  minimum: { index: number; lambda: number };
  oneStandardError: { index: number; lambda: number };
  /** Nonzero terms of the full-data fit per lambda (for the top axis of the CV chart). */
  nonzero: number[];
  curves: CvCurveDto[];
  /** Fold fits with any lambda stopped at the iteration limit or failed. */
  unconvergedFolds: number[];
}

export type ChoiceRule = 'minimum' | 'one-standard-error' | 'manual' | 'last';

export interface ChosenLambdaDto {
  index: number;
  lambda: number;
  /** minimum / one-standard-error: a CV rule; manual: picked by a person; last: no CV, the path's end. */
  rule: ChoiceRule;
  chosenBy: UserRef | null;
  chosenAt: string | null;
}

/** Unpenalized refit on the terms kept at the chosen lambda (the engine's QR / IRLS fit). */
export interface RefitDto {
  status: 'converged' | 'iteration-limit' | 'separation' | 'rank-deficient' | 'numerical-failure';
  message: string;
  intercept: RefitRowDto;
  coefficients: RefitRowDto[];
  aliased: string[];
  statisticKind: 't' | 'z';
  residualDf: number;
  /** The post-selection caution, always shown with the refit. */
  caution: string;
}
export interface RefitRowDto {
  term: string;
  estimate: number;
  standardError: number | null;
  statistic: number | null;
  pValue: number | null;
}

export interface GaussianDiagnosticsDto {
  family: 'gaussian';
  /** Which rows: the holdout when one was set aside, else the rows fitted. */
  rows: 'fitted' | 'holdout';
  rowCount: number;
  rSquared: number;
  rmse: number;
  /** At most DIAGNOSTIC_SAMPLE points (evenly spaced sample of the rows, in row order). */
  fitted: number[];
  residual: number[];
}
export interface BinomialDiagnosticsDto {
  family: 'binomial';
  rows: 'fitted' | 'holdout';
  rowCount: number;
  auc: number;
  /** ROC points from (0, 0) to (1, 1), at most ROC_POINTS. */
  roc: { falsePositiveRate: number; truePositiveRate: number; threshold: number }[];
  /** Calibration: rows binned by predicted probability. */
  calibration: { meanPredicted: number; observedShare: number; count: number }[];
  /** For a confusion table at any threshold: a sample of (probability, observed 0/1), at most DIAGNOSTIC_SAMPLE. */
  probabilities: number[];
  observed: (0 | 1)[];
  /** The level counted as 1, when the outcome is text. */
  positiveClass: string | null;
  /** The level counted as 0, when the outcome is text (absent in fits stored before it was added). */
  negativeClass?: string | null;
}
export const DIAGNOSTIC_SAMPLE = 2000;
export const ROC_POINTS = 200;
export const CALIBRATION_BINS = 10;

export interface HoldoutMetricsDto {
  rowCount: number;
  /** gaussian: mse, rmse, mae, rSquared; binomial: deviance, auc, misclassification. */
  metrics: { name: string; value: number }[];
}

/** Everything that depends on the chosen lambda and needs the data (computed by a worker). */
export interface EvaluationDto {
  index: number;
  state: 'waiting' | 'ready' | 'failed';
  message: string | null;
  refit: RefitDto | null;
  diagnostics: GaussianDiagnosticsDto | BinomialDiagnosticsDto | null;
  holdout: HoldoutMetricsDto | null;
}

export interface FitResultsDto {
  /** Design columns: predictor names, or `column=level` for a category. */
  terms: string[];
  /** The predictor column each term comes from. */
  termColumns: string[];
  /** The group of each term (group lasso), else null. */
  termGroups: (string | null)[];
  lambda: number[];
  lambdaMax: number;
  intercept: number[];
  /** Original scale, one sparse vector per lambda. */
  coefficients: SparseTerms[];
  standardizedIntercept: number[];
  standardizedCoefficients: SparseTerms[];
  nonzero: number[];
  devianceExplained: number[];
  certificates: LambdaCertificateDto[];
  /** Indices of lambdas whose solve did not converge. */
  unconvergedLambdas: number[];
  cv: CvResultDto | null;
  chosen: ChosenLambdaDto;
  /** Per term: share of CV folds whose fit at the chosen lambda keeps it (null without CV). */
  stability: number[] | null;
  evaluation: EvaluationDto;
  rowsFitted: number;
  rowsDropped: number;
  notes: string[];
}

export interface SpecChangeDto {
  /** Dotted path of the spec field, e.g. "cv.folds", "penalty", "predictors". */
  field: string;
  before: unknown;
  after: unknown;
  /** Plain sentence, e.g. 'Added predictors: x3, x4'. */
  summary: string;
}

export interface FitTimingsDto {
  /** Waiting in the queue before the first worker started. */
  waitingMs: number | null;
  pathMs: number | null;
  cvMs: number | null;
  totalMs: number | null;
}

/** GET /api/workspaces/:workspaceId/fits/:fitId */
export interface FitDetailDto extends FitSummaryDto {
  modelName: string;
  outcome: string;
  family: FitFamily;
  spec: FitSpec;
  engineVersion: string;
  /** The seed the folds and holdout used (null without random splits). */
  seed: number | null;
  timings: FitTimingsDto;
  progress: FitProgressDto;
  /** Against the previous version of the model; null for version 1. */
  specChanges: SpecChangeDto[] | null;
  previousVersion: { id: string; version: number } | null;
  /** Set when status is finished. */
  results: FitResultsDto | null;
}

/** The API, for reference (all under /api/workspaces/:workspaceId; state-changing ones need the CSRF header). */
export const FIT_ENDPOINTS = {
  listModels: 'GET /models',
  createModel: 'POST /models',
  model: 'GET /models/:modelId',
  runFit: 'POST /models/:modelId/fits',
  fit: 'GET /fits/:fitId',
  progress: 'GET /fits/:fitId/progress',
  cancel: 'POST /fits/:fitId/cancel',
  choose: 'POST /fits/:fitId/choice',
  predictVersion: 'GET /fits/:fitId/predictions?datasetVersionId=...',
  predictFile: 'POST /fits/:fitId/predictions (multipart field "file")',
} as const;
