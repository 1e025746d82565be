/**
 * The binomial loss's row kernel, its Newton loop on a fixed support (server/engine/core/polishNewton.ts)
 * and its residual reuse (loss/binomial.ts), each against plain formulas computed here:
 * - logisticRows: log(1 + exp(eta)) - y eta, mu - y and mu (1 - mu) from one exp per row, finite at
 *   |eta| = 1000, against the textbook forms where those are exact;
 * - weightedGram: [X_A 1]' W [X_A 1] / n entry by entry, for every count of columns a register block
 *   can leave over, to the bit (each entry is one left-to-right sum over the rows);
 * - the polish's next round at the same lambda borders the last Hessian (fewer Hessians, same answer);
 * - the path tangent's second-order prediction is closer to the next solution than the first-order one;
 * - newtonOnSupport: the gradient of the smooth support objective vanishes at its answer (to what its
 *   stopping rule promises), and from a start near the answer one Hessian serves (the chord step);
 * - the bound loss's value, gradient and residual follow an image changed in place (the reuse is
 *   keyed on the image's values, never on the array);
 * - negativeGradient: x_j'(y - mu)/n off the support, as the polish's KKT check reads it;
 * - the duality gap of a point is the same to the bit whatever was asked before (the kept residual
 *   and entropy sums are keyed on values, never on arrays or on the order of questions).
 */
import { describe, expect, it } from 'vitest';
import { FREE } from '../../../server/engine/core/loss';
import { logisticRows, weightedGram } from '../../../server/engine/core/logisticRows';
import { predict } from '../../../server/engine/core/pathTangent';
import { NewtonScratch, newtonOnSupport } from '../../../server/engine/core/polishNewton';
import { makeWorkingSet, type Problem } from '../../../server/engine/core/problem';
import { checkFull } from '../../../server/engine/path/check';
import { prepareProblem } from '../../../server/engine/path/setup';
import { createRng } from '../../../server/engine/random';
import { expectClose } from '../../support/numbers';

const n = 120;
const p = 6;
const rng = createRng(17);
const x = Float64Array.from({ length: n * p }, () => rng.normal());
const y = Float64Array.from({ length: n }, (_, i) => (0.8 * x[i] - 0.6 * x[n + i] + 0.4 * x[2 * n + i] + rng.normal() > 0 ? 1 : 0));
const { problem } = prepareProblem({ n, p, x, terms: ['a', 'b', 'c', 'd', 'e', 'f'] }, y, { family: 'binomial', penalty: 'lasso', standardize: true });

const sigmoid = (z: number) => 1 / (1 + Math.exp(-z));

/**
 * Newton stops once the next decrement would be below 1e-20 (polishNewton.ts, FINAL), so the
 * gradient's H^-1 norm is below 1e-10 and, with these standardized columns and weights <= 1/4,
 * every entry below about 1e-10.
 */
const GRADIENT = 1e-10;

/** Gradient of (1/n) sum [log(1 + exp(eta)) - y eta] + sum_A (l1 s b + l2/2 b^2) in (b_A, b0), plainly. */
function supportGradient(pr: Problem, features: number[], beta: Float64Array, linear: number[], ridge: number[]): Float64Array {
  const m = features.length;
  const r = new Float64Array(pr.n);
  for (let i = 0; i < pr.n; i++) {
    let eta = beta[m];
    for (let q = 0; q < m; q++) eta += beta[q] * pr.x[features[q] * pr.n + i];
    r[i] = sigmoid(eta) - pr.y[i];
  }
  const g = new Float64Array(m + 1);
  for (let q = 0; q < m; q++) {
    let s = 0;
    for (let i = 0; i < pr.n; i++) s += r[i] * pr.x[features[q] * pr.n + i];
    g[q] = s / pr.n + linear[q] + ridge[q] * beta[q];
  }
  g[m] = r.reduce((a, b) => a + b, 0) / pr.n;
  return g;
}

describe('logisticRows (one exp per row)', () => {
  it('gives the loss, mu - y and mu (1 - mu) of the textbook formulas, and stays finite at |eta| = 1000', () => {
    const eta = Float64Array.from([-1000, -40, -3, -1e-20, 0, 1e-20, 0.5, 3, 40, 1000]);
    const yy = Float64Array.from(eta, (_, i) => i % 2);
    const residual = new Float64Array(eta.length);
    const weight = new Float64Array(eta.length);
    const sum = logisticRows(eta, yy, eta.length, residual, weight);
    let expected = 0;
    eta.forEach((z, i) => {
      // log(1 + exp(z)) = z + log(1 + exp(-z)) for z > 0: exact forms that do not overflow.
      const softplus = z > 0 ? z + Math.log1p(Math.exp(-z)) : Math.log1p(Math.exp(z));
      expected += softplus - yy[i] * z;
      const mu = sigmoid(z);
      expectClose(`mu - y at eta ${z}`, residual[i], mu - yy[i], 1e-15);
      expectClose(`mu (1 - mu) at eta ${z}`, weight[i], mu * (1 - mu), 1e-15);
      expect(Number.isFinite(residual[i]) && Number.isFinite(weight[i]), `finite at eta ${z}`).toBe(true);
    });
    expectClose('sum of the row losses', sum, expected, 1e-15);
    // Far in the tails the weight is exp(-|eta|), not 0: 1 - mu does not round to 0 early.
    expectClose('weight at eta 40', weight[8], Math.exp(-40), 1e-12);
  });
});

describe('newtonOnSupport', () => {
  const ws = makeWorkingSet(problem.penalty, Int32Array.from({ length: p }, (_, u) => u), true);
  const active = [0, 1, 2, 4];
  const features = active.map((b) => ws.features[b]);
  const lambda = 0.02;
  const sign = new Int8Array(p);
  sign.set([1, -1, 1, 0, FREE]);
  const l1 = Float64Array.from({ length: p }, (_, b) => (sign[b] === FREE ? 0 : 0.7 * lambda));
  const l2 = Float64Array.from({ length: p }, (_, b) => (sign[b] === FREE ? 0 : 0.3 * lambda));
  const linear = active.map((b) => (sign[b] === FREE ? 0 : l1[b] * sign[b]));
  const ridge = active.map((b) => l2[b]);
  const support = { ws, active, sign, l1, l2, lambda };
  const gradientAt = (out: Float64Array) => {
    const beta = Float64Array.from([...active.map((b) => out[b]), out[ws.k]]);
    return supportGradient(problem, features, beta, linear, ridge);
  };

  it('ends where the gradient of the support objective vanishes', () => {
    const out = new Float64Array(ws.size);
    const outcome = newtonOnSupport(problem, support, out, 100, {}, new NewtonScratch(n));
    expect(outcome.ok).toBe(true);
    gradientAt(out).forEach((g, q) => expect(Math.abs(g), `gradient entry ${q}: ${g} (tolerance ${GRADIENT})`).toBeLessThanOrEqual(GRADIENT));
    for (let b = 0; b < ws.k; b++) if (!active.includes(b)) expect(out[b], `coefficient ${b} off the support`).toBe(0);
  });

  it('from a start near the answer, one Hessian and a chord step reach the same point', () => {
    const solved = new Float64Array(ws.size);
    newtonOnSupport(problem, support, solved, 100, {}, new NewtonScratch(n));
    const start = Float64Array.from(solved, (v, b) => (active.includes(b) || b === ws.k ? v + 1e-3 * Math.cos(b) : 0));
    const out = Float64Array.from(start);
    const outcome = newtonOnSupport(problem, support, out, 100, {}, new NewtonScratch(n));
    expect(outcome.ok).toBe(true);
    // Without the chord step the second step would rebuild the Hessian (hessians = 2).
    expect(outcome.hessians, `Hessians built: ${outcome.hessians}, steps ${outcome.steps}`).toBe(1);
    expect(outcome.steps).toBeGreaterThanOrEqual(2);
    gradientAt(out).forEach((g, q) => expect(Math.abs(g), `gradient entry ${q}: ${g} (tolerance ${GRADIENT})`).toBeLessThanOrEqual(GRADIENT));
    for (let b = 0; b < ws.size; b++) expectClose(`coefficient ${b}`, out[b], solved[b], 1e-10);
  });
});

describe("the polish's next round at the same lambda", () => {
  it('borders the last Hessian with the new column instead of building one, and reaches the same answer', () => {
    const ws = makeWorkingSet(problem.penalty, Int32Array.from({ length: p }, (_, u) => u), true);
    const lambda = 0.03;
    const sign = new Int8Array(p);
    sign.set([1, -1, 0, 0, 0, 0]);
    const l1 = new Float64Array(p).fill(lambda);
    const l2 = new Float64Array(p);
    const scratch = new NewtonScratch(n);
    const out = new Float64Array(ws.size);
    expect(newtonOnSupport(problem, { ws, active: [0, 1], sign, l1, l2, lambda }, out, 100, {}, scratch).ok).toBe(true);
    // Column 2 joins with the sign of its gradient, as the polish's KKT check would add it.
    const joined = Int8Array.from(sign);
    joined[2] = problem.loss.negativeGradient(ws, [0, 1], out)[2] > 0 ? 1 : -1;
    const support = { ws, active: [0, 1, 2], sign: joined, l1, l2, lambda };
    const next = Float64Array.from(out);
    const outcome = newtonOnSupport(problem, support, next, 100, {}, scratch);
    const fresh = Float64Array.from(out);
    const reference = newtonOnSupport(problem, support, fresh, 100, {}, new NewtonScratch(n));
    expect(outcome.ok && reference.ok).toBe(true);
    expect(outcome.hessians, `Hessians bordered run ${outcome.hessians}, fresh run ${reference.hessians}`).toBeLessThan(reference.hessians);
    for (let b = 0; b < ws.size; b++) expectClose(`coefficient ${b}`, next[b], fresh[b], 1e-10);
  });
});

describe('path tangent (predictor along lambda on a fixed support)', () => {
  it('predicts the next solution with the quadratic term closer than with the tangent alone', () => {
    const ws = makeWorkingSet(problem.penalty, Int32Array.from({ length: p }, (_, u) => u), true);
    const active = [0, 1, 2];
    const sign = new Int8Array(p);
    sign.set([1, -1, 1]);
    const at = (lambda: number) => ({ ws, active, sign, l1: new Float64Array(p).fill(0.7 * lambda), l2: new Float64Array(p).fill(0.3 * lambda), lambda });
    const grid = [0.05, 0.045, 0.0405];
    const memory = {};
    const scratch = new NewtonScratch(n);
    const out = new Float64Array(ws.size);
    newtonOnSupport(problem, at(grid[0]), out, 100, memory, scratch);
    newtonOnSupport(problem, at(grid[1]), out, 100, memory, scratch);
    const truth = new Float64Array(ws.size);
    newtonOnSupport(problem, at(grid[2]), truth, 100, {}, new NewtonScratch(n));
    const start = Float64Array.from([...active.map((b) => out[b]), out[ws.k]]);
    const second = Float64Array.from(start);
    predict(memory, grid[2], Int32Array.from(active, (b) => ws.features[b]), Int8Array.from(active, (b) => sign[b]), second);
    const tangent = (memory as { tangent?: { direction: Float64Array } }).tangent;
    expect(tangent).toBeDefined();
    const first = Float64Array.from(start, (v, q) => v + (grid[2] - grid[1]) * (tangent as { direction: Float64Array }).direction[q]);
    const wanted = [...active.map((b) => truth[b]), truth[ws.k]];
    const error = (v: Float64Array) => Math.max(...wanted.map((t, q) => Math.abs(v[q] - t)));
    expect(error(first), 'the first-order prediction is not exact').toBeGreaterThan(0);
    expect(error(second), `second-order error ${error(second)}, first-order ${error(first)}`).toBeLessThan(0.2 * error(first));
  });
});

describe('binomial loss: residual reuse and the KKT gradient', () => {
  const ws = makeWorkingSet(problem.penalty, Int32Array.from({ length: p }, (_, u) => u), true);
  const bound = problem.loss.bind(ws);

  it('value, gradient and residual follow an image changed in place', () => {
    const img = new Float64Array(n);
    const w = Float64Array.from({ length: ws.size }, (_, b) => 0.2 * Math.sin(b + 1));
    bound.image(w, img);
    bound.value(img, w);
    // Same array, new values: the reuse must notice.
    const w2 = Float64Array.from(w, (v) => v - 0.1);
    bound.image(w2, img);
    const grad = new Float64Array(ws.size);
    bound.gradient(img, w2, grad);
    const theta = bound.residual(img, w2).theta as Float64Array;
    const value = bound.value(img, w2);
    let expectedValue = 0;
    const r = Float64Array.from(img, (z, i) => {
      expectedValue += Math.log1p(Math.exp(z)) - problem.y[i] * z;
      return sigmoid(z) - problem.y[i];
    });
    expectClose('value', value, expectedValue / n, 1e-14);
    for (let i = 0; i < n; i++) expectClose(`theta_${i}`, theta[i], -r[i] / n, 1e-14);
    for (let b = 0; b < ws.k; b++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += r[i] * problem.x[ws.features[b] * n + i];
      expectClose(`gradient ${b}`, grad[b], s / n, 1e-13);
    }
    expectClose('intercept gradient', grad[ws.k], r.reduce((a, v) => a + v, 0) / n, 1e-13);
  });

  it("negativeGradient gives x_j'(y - mu)/n off the support, after a Newton solve and without one", () => {
    const active = [1, 3];
    const sign = new Int8Array(p);
    sign.set([0, 1, 0, -1, 0, 0]);
    const lambda = 0.05;
    const l1 = new Float64Array(p).fill(lambda);
    const l2 = new Float64Array(p);
    const out = new Float64Array(ws.size);
    expect(problem.loss.solveOnSupport({ ws, active, sign, l1, l2, lambda }, out, 100, {}).ok).toBe(true);
    const expected = (w: Float64Array) => {
      const r = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        let eta = w[ws.k];
        for (const a of active) eta += w[a] * problem.x[ws.features[a] * n + i];
        r[i] = problem.y[i] - sigmoid(eta);
      }
      return Array.from({ length: ws.k }, (_, b) => r.reduce((s, v, i) => s + v * problem.x[ws.features[b] * n + i], 0) / n);
    };
    for (const w of [out, Float64Array.from(out, (v, b) => (active.includes(b) ? v * 1.1 : v))]) {
      const got = problem.loss.negativeGradient(ws, active, w);
      const want = expected(w);
      for (let b = 0; b < ws.k; b++) if (!active.includes(b)) expectClose(`x_${b}'theta`, got[b], want[b], 1e-13);
    }
  });

  it('the full check gives the same gap to the bit after other questions as on a fresh problem', () => {
    const at = (pr: typeof problem, dual: Parameters<typeof checkFull>[1], lambda: number) => {
      const pen = pr.penalty;
      const coef = Float64Array.from({ length: p }, (_, j) => (j < 3 ? 0.3 - 0.2 * j : 0));
      return checkFull(pr, dual, Int32Array.from({ length: pen.nBlocks }, (_, u) => u), pen.start, coef, 0.1, lambda);
    };
    const options = { family: 'binomial' as const, penalty: 'lasso' as const, standardize: true };
    const used = prepareProblem({ n, p, x, terms: ['a', 'b', 'c', 'd', 'e', 'f'] }, y, options);
    // Below lambda_max, so the dual's anchor (kappa) and its box step differ between the lambdas.
    const [high, low] = [0.5 * used.lambdaMax, 0.2 * used.lambdaMax];
    const sequence = [high, low, high].map((lambda) => at(used.problem, used.dual, lambda));
    const freshAt = (lambda: number) => {
      const fresh = prepareProblem({ n, p, x, terms: ['a', 'b', 'c', 'd', 'e', 'f'] }, y, options);
      return at(fresh.problem, fresh.dual, lambda);
    };
    const [first, second] = [freshAt(high), freshAt(low)];
    expect(first.gap).not.toBe(second.gap);
    expect(sequence.map((c) => c.gap)).toEqual([first.gap, second.gap, first.gap]);
    const again = sequence[2];
    expect(again.gap).toBe(first.gap);
    expect(again.loss).toBe(first.loss);
    expect(Array.from(again.g)).toEqual(Array.from(first.g));
  });

  it("the full check at the solver's image of a point gives the check without it, to the bit", () => {
    const options = { family: 'binomial' as const, penalty: 'lasso' as const, standardize: true };
    const terms = ['a', 'b', 'c', 'd', 'e', 'f'];
    const [one, two] = [0, 1].map(() => prepareProblem({ n, p, x, terms }, y, options));
    const lambda = 0.3 * one.lambdaMax;
    const allWs = makeWorkingSet(one.problem.penalty, Int32Array.from({ length: p }, (_, u) => u), true);
    const w = Float64Array.from({ length: allWs.size }, (_, b) => (b === 2 || b === 4 ? 0 : 0.25 * Math.cos(b + 1)));
    const coef = new Float64Array(p);
    for (let b = 0; b < allWs.k; b++) coef[allWs.features[b]] = w[b];
    const img = new Float64Array(n);
    one.problem.loss.bind(allWs).image(w, img);
    const blocks = Int32Array.from({ length: p }, (_, u) => u);
    const given = checkFull(one.problem, one.dual, blocks, one.problem.penalty.start, coef, w[allWs.k], lambda, undefined, undefined, img);
    const fresh = checkFull(two.problem, two.dual, blocks, two.problem.penalty.start, coef, w[allWs.k], lambda);
    expect(given.gap).toBe(fresh.gap);
    expect(given.loss).toBe(fresh.loss);
    expect(Array.from(given.g)).toEqual(Array.from(fresh.g));
  });

  it("after a solve on a support, the gap check's value and gradient at its answer are a fresh problem's, to the bit", () => {
    const options = { family: 'binomial' as const, penalty: 'lasso' as const, standardize: true };
    const terms = ['a', 'b', 'c', 'd', 'e', 'f'];
    const [solved, fresh] = [prepareProblem({ n, p, x, terms }, y, options), prepareProblem({ n, p, x, terms }, y, options)];
    const wsOf = (pr: typeof problem) => makeWorkingSet(pr.penalty, Int32Array.from({ length: p }, (_, u) => u), true);
    const ws = wsOf(solved.problem);
    const sign = new Int8Array(p);
    sign.set([1, -1, 1]);
    const lambda = 0.02;
    const out = new Float64Array(ws.size);
    const support = { ws, active: [0, 1, 2], sign, l1: new Float64Array(p).fill(lambda), l2: new Float64Array(p), lambda };
    expect(solved.problem.loss.solveOnSupport(support, out, 100, {}).ok).toBe(true);
    const answer = (pr: typeof problem, wsUsed: typeof ws) => {
      const bound = pr.loss.bind(wsUsed);
      const img = new Float64Array(n);
      bound.image(out, img);
      const grad = new Float64Array(wsUsed.size);
      bound.gradient(img, out, grad);
      return [bound.value(img, out), ...grad];
    };
    expect(answer(solved.problem, ws)).toEqual(answer(fresh.problem, wsOf(fresh.problem)));
  });
});

describe('weightedGram', () => {
  it('equals [X_A 1]\' W [X_A 1] / n written out, to the bit, for 1 to 8 columns in any order', () => {
    const rows = 37;
    const cols = 9;
    const gen = createRng(5);
    const data = Float64Array.from({ length: rows * cols }, () => gen.normal());
    const w = Float64Array.from({ length: rows }, () => 0.25 * gen.next());
    for (let count = 1; count <= 8; count++) {
      // Columns out of order and not from 0, as a support's are.
      const columns = Array.from({ length: count }, (_, q) => (7 * q + 3) % cols);
      const offsets = Int32Array.from(columns, (c) => c * rows);
      const m = count + 1;
      const hess = new Float64Array(m * m).fill(NaN);
      weightedGram(data, rows, offsets, w, new Float64Array(count * rows), hess);
      const entry = (q: number, r: number): number => {
        let s = 0;
        for (let i = 0; i < rows; i++) {
          const wq = q === count ? w[i] : w[i] * data[offsets[q] + i];
          s += r === count ? wq : wq * data[offsets[r] + i];
        }
        return s / rows;
      };
      for (let q = 0; q < m; q++) {
        for (let r = 0; r <= q; r++) {
          // The intercept's row is sum w x_r (the weighted column's own sum) and sum w.
          const expected = q === count ? entry(r, count) : entry(q, r);
          expect(hess[q * m + r], `${count} columns: entry (${q}, ${r})`).toBe(expected);
          expect(hess[r * m + q], `${count} columns: entry (${r}, ${q})`).toBe(expected);
        }
      }
    }
  });
});
