/**
 * The unpenalized fit (lambda = 0) and the refit on a selected support, with classical inference.
 * gaussian: least squares by Householder QR; binomial: Newton/IRLS with step halving.
 */
import { EngineInputError, type DesignMatrix, type Family } from '../types';
import { fitBinomial } from './binomial';
import { checkBinaryResponse, checkInputs } from './checks';
import { fitGaussian } from './gaussian';
import type { UnpenalizedOptions, UnpenalizedResult } from './types';

export type { CoefficientRow, UnpenalizedOptions, UnpenalizedResult, UnpenalizedStatus } from './types';

/** Inference after selection is optimistic: the same data chose the terms and now tests them. */
export const POST_SELECTION_CAUTION =
  'These terms were chosen by the penalized fit on the same data, so the standard errors, statistics and ' +
  'p-values below are naive: they ignore the selection step and are too optimistic (p-values too small, ' +
  'intervals too narrow). Use them to describe the refit, not to confirm that the terms matter; a held-out ' +
  'sample or a selective-inference method is needed for valid tests.';

export function fitUnpenalized(
  design: DesignMatrix,
  y: Float64Array,
  family: Family,
  options: UnpenalizedOptions = {},
): UnpenalizedResult {
  checkInputs(design, y);
  if (family === 'gaussian') return fitGaussian(design, y);
  checkBinaryResponse(y);
  return fitBinomial(design, y, options);
}

/** Refits without penalty on the named terms only and attaches the post-selection caution. */
export function refitSelected(
  design: DesignMatrix,
  y: Float64Array,
  family: Family,
  selectedTerms: string[],
  options: UnpenalizedOptions = {},
): UnpenalizedResult {
  const result = fitUnpenalized(subDesign(design, selectedTerms), y, family, options);
  return { ...result, caution: POST_SELECTION_CAUTION };
}

export function subDesign(design: DesignMatrix, selectedTerms: string[]): DesignMatrix {
  const { n, x, terms } = design;
  const index = selectedTerms.map((term) => {
    const j = terms.indexOf(term);
    if (j < 0) throw new EngineInputError(`Selected term '${term}' is not a column of the design.`, term);
    return j;
  });
  const duplicate = selectedTerms.find((t, k) => selectedTerms.indexOf(t) !== k);
  if (duplicate !== undefined) throw new EngineInputError(`Selected term '${duplicate}' is listed twice.`, duplicate);
  const sub = new Float64Array(n * index.length);
  index.forEach((j, k) => sub.set(x.subarray(j * n, (j + 1) * n), k * n));
  return { n, p: index.length, x: sub, terms: [...selectedTerms] };
}
