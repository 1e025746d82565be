/**
 * The JSON object `lariat fit` prints (docs/cli.md): the contract
 * keys first, then extras (standardized coefficients, counts, notes, cautions, version).
 */
import { CAUTION_LINES } from '../../shared/cautions';
import type { CvResult, PathResult } from '../engine/types';

export interface FitOutput {
  lambda: number[];
  intercept: number[];
  coefficients: Record<string, number[]>;
  dualityGap: number[];
  iterations: number[];
  status: string[];
  cv: null | (Pick<CvResult, 'folds' | 'metric' | 'mean' | 'standardError' | 'minimum' | 'oneStandardError'> & {
    curves: Record<string, { mean: number[]; standardError: number[] }>;
  });
  family: string;
  lambdaMax: number;
  standardizedIntercept: number[];
  standardizedCoefficients: Record<string, number[]>;
  nonzero: number[];
  devianceExplained: number[];
  notes: string[];
  /** The usual statistical cautions that go with every exported result. */
  cautions: readonly string[];
  /** Solves that did not converge, with their gap and tolerance. */
  warnings: string[];
  engineVersion: string;
}

function byTerm(terms: string[], perLambda: Float64Array[]): Record<string, number[]> {
  const out: Record<string, number[]> = {};
  terms.forEach((term, j) => {
    out[term] = perLambda.map((b) => b[j]);
  });
  return out;
}

/** Solves that did not converge, named with their gap and tolerance (STYLE.md 9: never silent). */
function warningsOf(path: PathResult): string[] {
  return path.solves.flatMap((s, l) =>
    s.status === 'converged'
      ? []
      : [`lambda ${path.lambda[l]} (index ${l}): ${s.status}, relative gap ${s.gap} vs tolerance ${s.tolerance}: ${s.message}`],
  );
}

/**
 * The CV minimum at the smallest lambda means the best model may lie beyond the path's end (likely
 * with --no-standardize on columns of very different scales; docs/decisions/0011-path-depth.md).
 */
function cvNotes(path: PathResult, cv: CvResult | null): string[] {
  if (!cv || path.lambda.length < 2 || cv.minimum.index !== path.lambda.length - 1) return [];
  const last = path.lambda[path.lambda.length - 1];
  // When --max-terms ended the path (the engine's "path ended after ..." note), going deeper with
  // --path-decades changes nothing: the term limit is what stops it.
  if (path.notes.some((n) => n.startsWith('path ended after'))) {
    return [`the cross-validation minimum is at the last lambda of the path (${last}), where --max-terms ended it; a larger --max-terms (or none) may find a lower error`];
  }
  return [`the cross-validation minimum is at the smallest lambda of the path (${last}); a path reaching smaller lambdas (a larger --path-decades) may find a lower error`];
}

export function fitOutput(path: PathResult, cv: CvResult | null, engineVersion: string): FitOutput {
  return {
    lambda: path.lambda,
    intercept: path.intercept,
    coefficients: byTerm(path.terms, path.coefficients),
    dualityGap: path.solves.map((s) => s.gap),
    iterations: path.solves.map((s) => s.iterations),
    status: path.solves.map((s) => s.status),
    cv: cv && {
      folds: cv.folds,
      metric: cv.metric,
      mean: cv.mean,
      standardError: cv.standardError,
      minimum: cv.minimum,
      oneStandardError: cv.oneStandardError,
      curves: Object.fromEntries(cv.curves.map((c) => [c.metric, { mean: c.mean, standardError: c.standardError }])),
    },
    family: path.family,
    lambdaMax: path.lambdaMax,
    standardizedIntercept: path.standardizedIntercept,
    standardizedCoefficients: byTerm(path.terms, path.standardizedCoefficients),
    nonzero: path.nonzero,
    devianceExplained: path.devianceExplained,
    notes: [...path.notes, ...cvNotes(path, cv)],
    cautions: CAUTION_LINES,
    warnings: warningsOf(path),
    engineVersion,
  };
}

/** JSON has no NaN or Infinity: undefined values (e.g. a standard error from one fold) become null. */
export function toJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v));
}
