import type { DesignMatrix, PathOptions } from '../types';
import { checkPathOptions, prepareProblem } from './setup';

/** Common practice: lambda_min / lambda_max = 1e-4 when n > p, 1e-2 otherwise. */
export function defaultLambdaRatio(n: number, p: number): number {
  return n > p ? 1e-4 : 1e-2;
}

/** `length` values log-spaced from lambdaMax down to ratio * lambdaMax (descending). */
export function lambdaGrid(lambdaMax: number, length: number, ratio: number): number[] {
  if (length === 1) return [lambdaMax];
  const grid: number[] = [];
  const logMax = Math.log(lambdaMax);
  const step = Math.log(ratio) / (length - 1);
  for (let k = 0; k < length; k++) grid.push(k === 0 ? lambdaMax : Math.exp(logMax + k * step));
  return grid;
}

/**
 * The smallest lambda at which every penalized coefficient is zero: max over penalized blocks of
 * ||grad_u|| / (w_u alpha), the gradient taken at the null model (intercept and unpenalized columns
 * fitted, the rest zero), on the standardized scale when options.standardize.
 */
export function computeLambdaMax(design: DesignMatrix, y: Float64Array, options: PathOptions): number {
  checkPathOptions(design, y, options);
  return prepareProblem(design, y, options).lambdaMax;
}
