import { DEFAULTS } from './args';

/** `lariat fit --help`: every option in plain words, with its default and the reason for it (docs/cli.md). */
export const HELP = `Usage: npm run -s cli -- fit --data FILE.csv --response COLUMN [options]

Fits a sparse regression model at a sequence of penalty strengths (lambdas, strongest first) and
prints one JSON object on stdout. Cross-validation runs by default to help choose a lambda; --folds 0
turns it off, and then "cv" is null.

Data
  --data FILE.csv          CSV with a header row. A column is numeric when every present cell is a
                           number, otherwise categorical (one indicator per level). Missing cells:
                           empty, NA, N/A, NaN, null, ?  Rows with a missing value in a used column
                           are left out (the output's "notes" say how many).
  --response COLUMN        the outcome (binomial: 0/1, or a column with exactly two values)
  --predictors a,b,c       the columns to fit on; default every other column (except the fold column)

Model
  --family gaussian|binomial
                           gaussian: squared-error loss for a numeric outcome; binomial: logistic
                           loss for a two-class outcome. Default ${DEFAULTS.family}.
  --penalty lasso|elastic-net|group-lasso
                           lasso: sum of |coefficients|, sets many to exactly 0; elastic-net: mixes
                           the lasso with a squared (ridge) part, which keeps correlated columns
                           together; group-lasso: columns of a group enter or leave together.
                           Default ${DEFAULTS.penalty}, the simplest penalty that selects variables.
  --l1-share A             elastic-net only, and required there: the share of the lasso (L1) part,
                           in (0, 1]. 1 = the lasso; towards 0 the fit approaches ridge regression.
                           No default: the right mix depends on the data, so it is your choice.
  --groups FILE.json       group-lasso only: {"group name": ["column", ...]}. Other predictors form
                           groups of their own; a categorical predictor's indicators stay together.
  --penalty-weights FILE.json
                           {"column" or "column=level": weight}: multiplies that column's penalty.
                           Default 1 for every column; 0 leaves a column unpenalized (always in
                           the model); a larger weight makes a column harder to select.
  --no-standardize         penalize the coefficients of the raw columns. Default: each column is
                           centred and divided by its standard deviation (population, divisor n)
                           before fitting, so the penalty treats columns on different scales alike;
                           coefficients are always reported on the original scale too.

Lambda path
  --lambda v1,v2,...       your own lambdas, strictly descending (replaces the automatic path, so
                           not with --path-length, --path-decades or --max-terms)
  --path-length L          number of lambdas on the automatic path. Default ${DEFAULTS.pathLength}: enough for smooth
                           coefficient and cross-validation curves at a modest cost.
  --path-decades D         how far the automatic path goes: from lambda_max (the smallest lambda
                           at which every penalized coefficient is 0) down to lambda_max * 10^-D,
                           evenly spaced on the log scale. Default ${DEFAULTS.pathDecades}: on the bundled and
                           benchmark data the cross-validation minimum lay within 2.6 decades.
                           With --no-standardize and columns on very different scales, go
                           deeper (the notes say so when the minimum is at the path's end).
  --max-terms N            end the path after the first lambda whose model has more than N nonzero
                           coefficients (that model is kept). Default: no limit; use it to save
                           time when only small models are of interest.
  --tolerance T            each fit stops when its duality gap (how far its objective can be from
                           the best possible), divided by the objective of the intercept-only
                           model, is below T. Default ${DEFAULTS.tolerance}: enough for coefficients correct to
                           the 4 significant digits shown; a larger T is faster and rougher.
  --max-iterations N       iteration limit of one fit; a fit that reaches it is reported under
                           "warnings" with its gap. Default ${DEFAULTS.maxIterations}.

Cross-validation
  --folds K                split the rows into K >= 2 folds (default ${DEFAULTS.folds}, a common choice that
                           balances bias and cost); 0 = no cross-validation
  --fold-column COLUMN     integer fold ids from a column (not a predictor); replaces --folds
  --seed S                 seed of the random folds (class-balanced for binomial), default ${DEFAULTS.seed}, so
                           that a rerun gives the same folds
  --workers auto|on|off    on: folds in 2 worker threads; off: all in this thread; auto (default):
                           when other processes left at least 1.5 cores free while the data were
                           read, this thread and one worker share the folds (the worker starts on
                           them while the full path is fitted) when the work is large enough to
                           pay (folds x lambdas x p x min(n, p) >= 1e9); on a tall table
                           (n x p x lambdas >= 1e8) the worker sums half the folds' cross products
                           and scores each fold's held-out rows while this thread fits the next
                           fold; else all in this thread. The same results either way.

Output keys: lambda, intercept, coefficients {term: [per lambda]} (original scale), dualityGap
(relative, per lambda), iterations, status, cv (null or {folds, metric, mean, standardError,
minimum {index, lambda}, oneStandardError {index, lambda}, curves}), and also: family, lambdaMax,
standardizedIntercept, standardizedCoefficients, nonzero, devianceExplained (1 - deviance / null
deviance), notes, cautions (how to read the result), warnings (fits that did not converge),
engineVersion, timing (seconds spent reading, fitting, cross-validating; cvWorkers: 2 when a worker
shared the folds, 1 when it scored them, 0 when this thread did all).
Errors: a message on stderr and exit status 2 (bad input) or 1 (internal error).
`;
