import { SemidefiniteSolver } from '../core/gram';
import type { Problem } from '../core/problem';
import { sigmoid, softplus } from '../core/problem';

export interface NullFit {
  /** Standardized-scale coefficients: non-zero only on unpenalized columns. */
  coef: Float64Array;
  /** binomial intercept (gaussian: unused, the intercept is mean(y) on centred columns). */
  intercept: number;
  /** X'theta at the null model, theta = -d loss / d eta (column-indexed): lambda_max comes from it. */
  g: Float64Array;
  /** binomial: theta = (y - p_null)/n. */
  theta: Float64Array | null;
}

/**
 * The null model: every penalized coefficient 0, the intercept and unpenalized columns U at their
 * optimum. gaussian: least squares on U through G_UU (centred columns, so the intercept is mean(y));
 * binomial: Newton's method on (b_U, intercept) with step halving (closed form logit(mean y) when U
 * is empty).
 */
export function fitNullModel(problem: Problem, unpenalized: Int32Array): NullFit {
  const { p, n } = problem;
  const m = unpenalized.length;
  const coef = new Float64Array(p);
  const g = new Float64Array(p);
  if (problem.family === 'gaussian') {
    if (m > 0) {
      const solution = new Float64Array(m);
      const rhs = new Float64Array(m);
      for (let b = 0; b < m; b++) rhs[b] = problem.c[unpenalized[b]];
      gramSolver(problem, unpenalized).solve(rhs, solution);
      for (let b = 0; b < m; b++) coef[unpenalized[b]] = solution[b];
    }
    g.set(problem.c);
    for (let b = 0; b < m; b++) {
      const col = problem.gram.column(unpenalized[b]);
      const beta = coef[unpenalized[b]];
      for (let j = 0; j < p; j++) g[j] -= col[j] * beta;
    }
    return { coef, intercept: 0, g, theta: null };
  }

  const ym = Math.min(Math.max(problem.yMean, 1e-12), 1 - 1e-12);
  let intercept = Math.log(ym / (1 - ym));
  const eta = new Float64Array(n).fill(intercept);
  if (m > 0) intercept = newtonOnUnpenalized(problem, unpenalized, coef, eta, intercept);
  const theta = new Float64Array(n);
  for (let i = 0; i < n; i++) theta[i] = (problem.y[i] - sigmoid(eta[i])) / n;
  const { x } = problem;
  for (let j = 0; j < p; j++) {
    let s = 0;
    const off = j * n;
    for (let i = 0; i < n; i++) s += x[off + i] * theta[i];
    g[j] = s;
  }
  return { coef, intercept, g, theta };
}

function gramSolver(problem: Problem, cols: Int32Array): SemidefiniteSolver {
  const m = cols.length;
  const matrix = new Float64Array(m * m);
  for (let b = 0; b < m; b++) {
    const col = problem.gram.column(cols[b]);
    for (let a = 0; a < m; a++) matrix[b * m + a] = col[cols[a]];
  }
  return new SemidefiniteSolver(matrix, m);
}

function binomialLoss(problem: Problem, eta: Float64Array): number {
  let s = 0;
  for (let i = 0; i < problem.n; i++) s += softplus(eta[i]) - problem.y[i] * eta[i];
  return s / problem.n;
}

/** Newton on (b_U, intercept); fills coef[U] and eta, returns the intercept. */
function newtonOnUnpenalized(problem: Problem, cols: Int32Array, coef: Float64Array, eta: Float64Array, start: number): number {
  const { n, x, y } = problem;
  const m = cols.length + 1;
  const beta = new Float64Array(m);
  beta[m - 1] = start;
  const column = (b: number, i: number): number => (b === m - 1 ? 1 : x[cols[b] * n + i]);
  const grad = new Float64Array(m);
  const hess = new Float64Array(m * m);
  const step = new Float64Array(m);
  const trial = new Float64Array(n);
  let value = binomialLoss(problem, eta);
  for (let it = 0; it < 100; it++) {
    grad.fill(0);
    hess.fill(0);
    for (let i = 0; i < n; i++) {
      const mu = sigmoid(eta[i]);
      const r = mu - y[i];
      const wgt = mu * (1 - mu);
      for (let a = 0; a < m; a++) {
        const xa = column(a, i);
        grad[a] += (r * xa) / n;
        for (let b = 0; b <= a; b++) hess[a * m + b] += (wgt * xa * column(b, i)) / n;
      }
    }
    for (let a = 0; a < m; a++) for (let b = 0; b < a; b++) hess[b * m + a] = hess[a * m + b];
    new SemidefiniteSolver(hess, m).solve(grad, step);
    let scale = 1;
    let improved = false;
    for (let half = 0; half < 30; half++, scale /= 2) {
      for (let i = 0; i < n; i++) {
        let e = 0;
        for (let a = 0; a < m; a++) e += (beta[a] - scale * step[a]) * column(a, i);
        trial[i] = e;
      }
      const candidate = binomialLoss(problem, trial);
      if (candidate <= value) {
        for (let a = 0; a < m; a++) beta[a] -= scale * step[a];
        eta.set(trial);
        improved = value - candidate > 1e-16 * Math.max(1, value);
        value = candidate;
        break;
      }
    }
    if (!improved) break;
  }
  for (let b = 0; b < cols.length; b++) coef[cols[b]] = beta[b];
  return beta[m - 1];
}
