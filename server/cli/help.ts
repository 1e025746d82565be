import { DEFAULTS } from './args';

export const HELP = `Usage: npm run -s cli -- fit --data FILE.csv --response COLUMN [options]

Fits a regularization path and prints one JSON object on stdout. Cross-validation runs by default
(${DEFAULTS.folds} folds); --folds 0 turns it off, and then "cv" is null.

Data
  --data FILE.csv          CSV with a header row. A column is numeric when every present cell is a
                           number, otherwise categorical (one indicator per level). Missing cells:
                           empty, NA, N/A, NaN, null, ?  Rows with a missing value in a used column
                           are dropped.
  --response COLUMN        the outcome (binomial: 0/1, or a column with exactly two values)
  --predictors a,b,c       default: every other column (except the fold column)

Model
  --family gaussian|binomial                  default ${DEFAULTS.family}
  --penalty lasso|elastic-net|group-lasso     default ${DEFAULTS.penalty}
  --alpha A                elastic-net mix in (0, 1], default 0.5 (elastic-net only)
  --groups FILE.json       group lasso groups {"name": ["column", ...]}; other predictors form
                           groups of their own (a categorical predictor's indicators together)
  --no-standardize         penalize raw coefficients (default: columns centred and scaled by their
                           population sd; coefficients are reported on the original scale)

Lambda path
  --lambda v1,v2,...       explicit lambdas, strictly descending
  --path-length L          automatic grid size, default ${DEFAULTS.pathLength}, log-spaced from lambda_max
  --lambda-ratio R         lambda_min / lambda_max in (0, 1); default 1e-4 when rows > columns, else 1e-2
  --tolerance T            duality gap relative to the null-model objective, default ${DEFAULTS.tolerance}
  --max-iterations N       iteration limit per lambda, default ${DEFAULTS.maxIterations}

Cross-validation
  --folds K                K >= 2 folds (default ${DEFAULTS.folds}); 0 = no cross-validation
  --fold-column COLUMN     integer fold ids from a column (not a predictor); replaces --folds
  --seed S                 seed of the random (class-stratified for binomial) folds, default ${DEFAULTS.seed}
  --workers auto|on|off    on: folds in 2 worker threads; auto: when the folds after the first,
                           timed, would take over 0.3 s in one thread, on this thread and a worker

Output keys: lambda, intercept, coefficients {term: [per lambda]} (original scale), dualityGap,
iterations, status, cv (null or {folds, metric, mean, standardError, minimum {index, lambda},
oneStandardError {index, lambda}, curves}), and extras: family, lambdaMax, standardizedIntercept,
standardizedCoefficients, nonzero, devianceRatio, notes, cautions (how to read the result),
warnings (solves that did not converge), engineVersion, timing (seconds spent reading, fitting, cross-validating).
Errors: a message on stderr and exit status 2 (bad input) or 1 (internal error).
`;
