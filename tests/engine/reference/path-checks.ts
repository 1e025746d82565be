/**
 * Comparison of a Lariat path with a scikit-learn path from a fixture, collecting every mismatch
 * (lambda index, term, expected, got, tolerance) so a failure describes the whole discrepancy.
 */
import type { PathResult } from '../../../server/engine/types';

/** A path case as generate.py writes it (gaussian-paths.json and logistic-paths.json). */
export interface PathCase {
  id: string;
  standardize: boolean;
  penalty: 'lasso' | 'elastic-net';
  alpha: number;
  lambda: number[];
  call: string;
  sklearnInput: string;
  coef: number[][];
  intercept: number[];
  objective: number[];
  coefOriginal?: number[][];
  interceptOriginal?: number[];
}

export interface Standardization {
  mean: number[];
  sd: number[];
}

/** Coefficient tolerance of the brief: relative, scaled by max(1, |coef|) on the standardized scale. */
export const COEF_TOL = 1e-6;

/**
 * How far Lariat's coefficients may lie from the exact solution at lambda index k.
 * strictAllowance: the brief's COEF_TOL * max(1, |b_j|), for every penalty and family (the engine's
 * active-set polish reaches it; a duality-gap stop alone does not on nearly collinear columns).
 * elasticNetAllowance: what the gap alone guarantees, checked as well. The objective is strongly
 * convex with modulus mu = lambda (1 - alpha) (its ridge part), so F(b) - F* >= mu/2 ||b - b*||^2,
 * and a relative duality gap g bounds F(b) - F* by g * nullObjective (Boyd & Vandenberghe 2004,
 * section 9.1.2): the radius sqrt(2 g nullObjective / mu).
 */
export interface Allowance {
  coefficient: (k: number, expected: number) => number;
  /** Extra allowance on the standardized intercept, from the coefficient error (first order). */
  intercept: (k: number) => number;
}

export function strictAllowance(): Allowance {
  return { coefficient: (_k, b) => COEF_TOL * Math.max(1, Math.abs(b)), intercept: () => 0 };
}

/**
 * Elastic net. The optimal intercept for given b moves by a weighted average of -x_i'(b - b*), so by
 * Cauchy-Schwarz at most maxRowNorm * radius, maxRowNorm = max_i ||x_i|| on the fitted scale.
 */
export function elasticNetAllowance(c: PathCase, tolerance: number, nullObjective: number, maxRowNorm: number): Allowance {
  const radius = (k: number) => {
    const mu = c.lambda[k] * (1 - c.alpha);
    const excess = tolerance * nullObjective + 1e-14 * Math.abs(c.objective[k]);
    return Math.sqrt((2 * excess) / mu);
  };
  return {
    coefficient: (k, b) => Math.max(COEF_TOL * Math.max(1, Math.abs(b)), radius(k)),
    intercept: (k) => maxRowNorm * radius(k),
  };
}

export function comparePath(
  result: PathResult,
  c: PathCase,
  scale: Standardization | null,
  tolerance: number,
  allow: Allowance = strictAllowance(),
): string[] {
  const out: string[] = [];
  const close = (what: string, got: number, expected: number, bound: number) => {
    if (!(Math.abs(got - expected) <= bound)) out.push(`${what}: expected ${expected}, got ${got}, tolerance ${bound}`);
  };
  if (result.lambda.length !== c.lambda.length) return [`path length: expected ${c.lambda.length}, got ${result.lambda.length}`];
  c.lambda.forEach((lambda, k) => {
    const at = `lambda[${k}]=${lambda.toPrecision(6)}`;
    close(`${at} lambda`, result.lambda[k], lambda, 1e-14 * lambda);
    const solve = result.solves[k];
    if (solve.status !== 'converged' || !(solve.gap <= tolerance)) {
      out.push(`${at} solve: status ${solve.status}, gap ${solve.gap} (tolerance ${tolerance}), ${solve.message}`);
    }
    const std = result.standardizedCoefficients[k];
    c.coef[k].forEach((expected, j) => {
      close(`${at} ${result.terms[j]} standardized-scale coefficient`, std[j], expected, allow.coefficient(k, expected));
    });
    const interceptBound = COEF_TOL * Math.max(1, Math.abs(c.intercept[k])) + allow.intercept(k);
    close(`${at} standardized-scale intercept`, result.standardizedIntercept[k], c.intercept[k], interceptBound);
    if (!scale || !c.coefOriginal || !c.interceptOriginal) return;
    // Original scale: an error e_j on the standardized scale is e_j / sd_j here, so the bound is the
    // standardized one divided by sd_j; the intercept adds sum_j |mean_j| e_j / sd_j.
    let originalInterceptBound = interceptBound;
    c.coefOriginal[k].forEach((expected, j) => {
      const sd = scale.sd[j];
      const bound = allow.coefficient(k, c.coef[k][j]);
      close(`${at} ${result.terms[j]} original-scale coefficient`, result.coefficients[k][j], expected, bound / sd);
      originalInterceptBound += (Math.abs(scale.mean[j]) / sd) * bound;
    });
    close(`${at} original-scale intercept`, result.intercept[k], c.interceptOriginal[k], originalInterceptBound);
  });
  return out;
}

/**
 * The relative duality gap bounds the primal suboptimality: Lariat's objective at its solution may
 * exceed scikit-learn's (essentially optimal, KKT residual ~1e-12 in the fixture) by at most
 * gap * nullObjective, and may not be lower beyond rounding.
 */
export function compareObjective(
  objectiveAt: (k: number) => number,
  c: PathCase,
  nullObjective: number,
  tolerance: number,
): string[] {
  const out: string[] = [];
  c.lambda.forEach((lambda, k) => {
    const got = objectiveAt(k);
    const ref = c.objective[k];
    const upper = tolerance * nullObjective + 1e-13 * Math.abs(ref);
    if (!(got - ref <= upper && ref - got <= 1e-11 * Math.max(1, Math.abs(ref)))) {
      out.push(`lambda[${k}]=${lambda.toPrecision(6)} objective: scikit-learn ${ref}, Lariat ${got}, excess ${got - ref} (allowed ${upper})`);
    }
  });
  return out;
}

export function summary(id: string, call: string, problems: string[]): string {
  const shown = problems.slice(0, 12).join('\n  ');
  return `${id} vs ${call}: ${problems.length} mismatches\n  ${shown}${problems.length > 12 ? '\n  ...' : ''}`;
}
