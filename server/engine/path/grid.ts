import type { DesignMatrix, PathOptions } from '../types';
import { checkPathOptions, prepareProblem } from './setup';

/**
 * `length` values evenly spaced on the log scale from lambdaMax down to lambdaMax * 10^-decades
 * (descending). One rule for every shape of data (docs/engine.md, "The automatic path").
 */
export function lambdaGrid(lambdaMax: number, length: number, decades: number): number[] {
  if (length === 1) return [lambdaMax];
  const grid: number[] = [];
  const logMax = Math.log(lambdaMax);
  const step = (-decades * Math.LN10) / (length - 1);
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
