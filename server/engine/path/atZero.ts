import type { DualContext } from '../core/dual';
import type { Problem } from '../core/problem';
import type { StandardizedDesign } from '../core/standardize';
import { EngineInputError, type DesignMatrix, type SolveInfo } from '../types';
import { fitUnpenalized, type UnpenalizedResult } from '../unpenalized';
import { checkFull } from './check';
import type { PathState } from './solveAtLambda';

/** The exact fit at lambda = 0 on the original scale, recorded instead of record()'s conversion. */
export interface ZeroFit {
  info: SolveInfo;
  intercept: number;
  coefficients: Float64Array;
  note: string;
}

/**
 * lambda = 0 is the unpenalized fit (docs/engine.md; docs/decisions/0005): least squares by Householder QR for
 * gaussian, Newton/IRLS for binomial (../unpenalized), on the columns that are not constant over
 * the rows fitted. These reach the digits a first-order method cannot (NIST StRD Longley: >= 9
 * significant digits). Terms QR finds aliased (exact linear combinations of the intercept and
 * earlier terms, e.g. the last indicator of a fully encoded categorical predictor) get coefficient 0;
 * the note names them (docs/decisions/0005-lambda-zero-and-aliased-indicators.md). The duality gap is then computed
 * at the result as for any solve (the dual point projected on X'theta = 0), and the status follows
 * it: 'converged' when gap / null objective <= tolerance, else 'iteration-limit' (e.g. binomial
 * separation, where no finite minimizer exists), with the unpenalized fit's message.
 * Returns `{ fallback: reason }` when the factorization cannot be used (e.g. fewer rows than
 * coefficients): the caller then solves with FISTA as for any lambda and notes the reason.
 */
export function solveAtZero(
  design: DesignMatrix,
  y: Float64Array,
  problem: Problem,
  dual: DualContext,
  std: StandardizedDesign,
  state: PathState,
  tolerance: number,
): ZeroFit | { fallback: string } {
  const started = performance.now();
  const { n } = design;
  const used: number[] = [];
  for (let j = 0; j < design.p; j++) if (!std.constant[j]) used.push(j);
  const x = new Float64Array(n * used.length);
  used.forEach((j, k) => x.set(design.x.subarray(j * n, (j + 1) * n), k * n));
  let fit: UnpenalizedResult;
  try {
    fit = fitUnpenalized({ n, p: used.length, x, terms: used.map((j) => design.terms[j]) }, y, problem.family);
  } catch (error) {
    if (error instanceof EngineInputError) return { fallback: error.message };
    throw error;
  }
  const estimate = new Map(fit.coefficients.map((row) => [row.term, row.estimate]));
  const coefficients = new Float64Array(design.p);
  let shift = 0;
  for (const j of used) {
    const b = estimate.get(design.terms[j]) ?? 0;
    coefficients[j] = Number.isFinite(b) ? b : 0;
    state.coef[j] = coefficients[j] * std.scales[j];
    shift += std.centers[j] * coefficients[j];
  }
  const intercept = Number.isFinite(fit.intercept.estimate) ? fit.intercept.estimate : 0;
  // The solver's columns are centred: its intercept absorbs the centres (binomial only; the
  // gaussian intercept is the closed form mean(y) - centers'b).
  state.intercept = intercept + shift;
  const pen = problem.penalty;
  const allBlocks = Int32Array.from({ length: pen.nBlocks }, (_, u) => u);
  const check = checkFull(problem, dual, allBlocks, pen.start, state.coef, state.intercept, 0);
  state.g = check.g;
  state.loss = check.loss;
  const gap = check.gap;
  const status: SolveInfo['status'] = !Number.isFinite(gap) ? 'numerical-failure' : gap <= tolerance ? 'converged' : 'iteration-limit';
  const method = problem.family === 'gaussian' ? 'least squares by QR' : `Newton/IRLS (${fit.iterations} iterations)`;
  const message = `lambda = 0: unpenalized fit, ${method}; relative duality gap ${gap.toExponential(2)} ${status === 'converged' ? '<=' : '>'} ${tolerance}. ${fit.message}`;
  const note =
    fit.aliased.length > 0
      ? `lambda = 0: ${fit.aliased.map((t) => `"${t}"`).join(', ')} aliased with the intercept and earlier terms (coefficient 0)`
      : `lambda = 0: ${fit.status === 'converged' ? 'unpenalized fit' : fit.status} (${method})`;
  return {
    info: { status, message, gap, tolerance, iterations: fit.iterations, timeMs: performance.now() - started, stoppedBy: 'factorization' },
    intercept,
    coefficients,
    note,
  };
}
