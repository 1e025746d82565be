/**
 * The engine's defaults, in one place so the CLI, the API and the web form show the same values.
 * docs/engine.md explains each; the decision notes give the measurements behind the path depth and
 * the tolerance.
 */

/** Number of lambdas on the automatic path. */
export const DEFAULT_PATH_LENGTH = 100;

/**
 * Depth of the automatic path in powers of ten: it runs from lambda_max down to
 * lambda_max * 10^-DEFAULT_PATH_DECADES, whatever the shape of the data.
 */
export const DEFAULT_PATH_DECADES = 3;

/** Target relative duality gap (gap / null-model objective) of every solve. */
export const DEFAULT_TOLERANCE = 1e-7;

/** Iteration limit of one solve. */
export const DEFAULT_MAX_ITERATIONS = 10_000;
