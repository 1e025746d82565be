/**
 * The engine's defaults, in one place so the CLI, the API and the web form show the same values.
 * docs/engine.md explains each; the decision notes give the measurements behind the path depth and
 * the tolerance.
 */

/** Number of lambdas on the automatic path. */
export const DEFAULT_PATH_LENGTH = 100;

/**
 * Depth of the automatic path in powers of ten: it runs from lambda_max down to
 * lambda_max * 10^-DEFAULT_PATH_DECADES, whatever the shape of the data. Three decades reach past
 * the cross-validation minimum, with at least 0.4 decades to spare, on every standardized case
 * measured (docs/decisions/0006-path-depth.md).
 */
export const DEFAULT_PATH_DECADES = 3;

/**
 * Target relative duality gap (gap / null-model objective) of every solve: small enough that the
 * coefficients agree with a far tighter solve to the 4 significant digits the screens show
 * (docs/decisions/0007-default-tolerance.md).
 */
export const DEFAULT_TOLERANCE = 1e-9;

/** Iteration limit of one solve. */
export const DEFAULT_MAX_ITERATIONS = 10_000;
