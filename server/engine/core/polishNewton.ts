import { FREE, type SupportMemory, type SupportProblem } from './loss/role';
import { designImage } from './loss/design';
import { bordered, gradientOf, imageOf, logisticRows, moveAlong, sameStart, weightedGram } from './logisticRows';
import type { NewtonScratch } from './newtonScratch';
import type { Problem } from './problem';
import { predict, recordTangent } from './pathTangent';
import { SymmetricFactor } from './symmetric';

const MAX_NEWTON = 50;
/**
 * A Newton step whose predicted decrease (half the Newton decrement, Boyd & Vandenberghe 2004,
 * 9.5.1) is below this fraction of the function value is at the rounding level of the value: the
 * comparison with the old value can no longer tell better from worse, so the full step is taken
 * (quadratic convergence makes it the most accurate point) and Newton stops.
 */
const ROUNDING = 1e-15;
/**
 * After a full Newton step with decrement d (relative to the value) the next decrement is about d^2
 * (quadratic convergence): with d <= FINAL it would be below FINAL^2 = 1e-20, past any digit the
 * value or the KKT conditions can show, so Newton stops.
 */
const FINAL = 1e-10;
/**
 * After a full Newton step with decrement d_ref <= CHORD (relative to the value), the next steps
 * first try the same factor (chord steps: the simplified Newton method, Shamanskii 1967; see Kelley
 * 2003, "Solving Nonlinear Equations with Newton's Method", 5.4.3). Their contraction is
 * proportional to the distance from the factor's point, so after a chord step with decrement d the
 * next decrement is about d_ref d, as it is about d^2 after a Newton step: the same FINAL rule
 * (predicted next decrement <= FINAL^2) stops either. A chord step is taken only when its decrement
 * is at most CONTRACTION times the previous step's (at least one digit of the error per step);
 * otherwise the Hessian is rebuilt at the current point. Near the solution this replaces the last
 * Hessian (m^2 n / 2 products) by one or two chord steps (about 3 m n each).
 */
const CHORD = 1e-4;
const CONTRACTION = 1e-2;

export { NewtonScratch } from './newtonScratch';

/** Steps taken (Newton and chord, each one linear solve) and Hessians built. */
export interface NewtonOutcome {
  ok: boolean;
  steps: number;
  hessians: number;
}

/**
 * The one logistic Newton loop, used by the binomial active-set polish (polish.ts) and the binomial
 * null fit (loss/binomial.ts: every sign free, no penalty): Newton's method with step halving on the
 * smooth function of (b_A, b0) that equals the objective while the signs s hold:
 *   (1/n) sum [log(1 + exp(eta_i)) - y_i eta_i] + sum_A (l1_j s_j b_j + l2_j/2 b_j^2),
 * eta = b0 + X_A b_A, l1 = lambda alpha v, l2 = lambda (1 - alpha) v (0 for free columns).
 * Starts from `out` (slot k holds the intercept) and writes the minimizer there; zero off A.
 * Stops when a step moves every variable by < 1e-13 (relative), when its predicted decrease is at the
 * rounding level of the value (ROUNDING), or when the next decrement would be below FINAL^2 (FINAL,
 * CHORD). Each row's exp serves the value, the gradient and the Hessian weight at once
 * (logisticRows), and eta moves along the step's image X_A d rather than being rebuilt.
 * Returns the steps taken (Newton and chord) and ok = false on failure or when maxSteps do not suffice.
 */
export function newtonOnSupport(
  problem: Problem,
  support: SupportProblem,
  out: Float64Array,
  maxSteps: number,
  memory: SupportMemory,
  scratch: NewtonScratch,
): NewtonOutcome {
  const { ws, active, sign, l1, l2, lambda } = support;
  const { n, y, x } = problem;
  const k = ws.k;
  const m = active.length + 1;
  const last = m - 1;
  // The polish's next round after a column joined starts at the last solution (the new column at 0):
  // its image, residual and weights are still in the scratch buffers.
  const resume = scratch.features === ws.features && sameStart(scratch.solution, out);
  const solve = ++scratch.solves;
  scratch.solution = new Float64Array(0);
  const features = new Int32Array(last);
  const offsets = new Int32Array(last);
  const signs = new Int8Array(last);
  const beta = new Float64Array(m);
  const linear = new Float64Array(m);
  const ridge = new Float64Array(m);
  for (let q = 0; q < last; q++) {
    const a = active[q];
    features[q] = ws.features[a];
    offsets[q] = features[q] * n;
    signs[q] = sign[a];
    beta[q] = out[a];
    linear[q] = sign[a] === FREE ? 0 : l1[a] * sign[a];
    ridge[q] = l2[a];
  }
  beta[last] = out[k];
  const onTangent = predict(memory, lambda, features, signs, beta);
  const penaltyOf = (v: Float64Array): number => {
    let s = 0;
    for (let q = 0; q < last; q++) s += v[q] * (linear[q] + 0.5 * ridge[q] * v[q]);
    return s;
  };
  let loss = scratch.loss;
  if (onTangent || !resume) {
    imageOf(x, n, offsets, beta, scratch.eta);
    loss = logisticRows(scratch.eta, y, n, scratch.residual, scratch.weight) / n;
  }
  let value = loss + penaltyOf(beta);
  const weighted = scratch.weightedFor(last);
  const grad = new Float64Array(m);
  const hess = new Float64Array(m * m);
  const step = new Float64Array(m);
  const trial = new Float64Array(m);
  // The working vector (zero off the support) for the exact image of an ending step.
  const full = new Float64Array(ws.size);
  let factor: SymmetricFactor | null = null;
  // Relative decrement at the factor's point when chord steps may follow (CHORD), else 0; and the
  // previous step's decrement.
  let chordFrom = 0;
  let previous = 0;
  let kept = false;
  if (!onTangent && resume && scratch.last.solve === solve - 1) {
    // The polish's next round after columns joined starts where the last solve ended, and that
    // solve built the last Hessian: bordered with the new columns at the same weights, it is the
    // Hessian at a point whose decrement was last.decrement. The first step is a chord step whose
    // factor's point lies within (sqrt(last.decrement) + sqrt(d))^2 of the answer (d: its own
    // decrement); the Hessian is rebuilt as soon as a step contracts too little.
    bordered(x, n, scratch.last, features, hess);
    for (let q = 0; q < last; q++) hess[q * m + q] += ridge[q];
    factor = new SymmetricFactor(hess, m);
    chordFrom = Math.max(scratch.last.decrement, Number.MIN_VALUE);
    previous = Infinity;
    kept = true;
  }
  let steps = 0;
  let hessians = 0;
  let done = false;
  for (let it = 0; it < MAX_NEWTON && steps < maxSteps; it++) {
    steps++;
    gradientOf(x, n, offsets, scratch.residual, grad);
    for (let q = 0; q < last; q++) grad[q] += linear[q] + ridge[q] * beta[q];
    const scale0 = Math.max(1, Math.abs(value));
    let decrement = NaN;
    let chord = false;
    if (factor && chordFrom > 0) {
      if (!factor.solve(grad, step)) return { ok: false, steps, hessians };
      decrement = dot(grad, step, m);
      chord = decrement <= CONTRACTION * previous;
      if (kept) chordFrom = (Math.sqrt(chordFrom) + Math.sqrt(decrement / scale0)) ** 2;
      kept = false;
    }
    if (!chord) {
      chordFrom = 0;
      weightedGram(x, n, offsets, scratch.weight, weighted, hess);
      scratch.remember(hess, features, solve);
      for (let q = 0; q < last; q++) hess[q * m + q] += ridge[q];
      factor = new SymmetricFactor(hess, m);
      hessians++;
      if (!factor.solve(grad, step)) return { ok: false, steps, hessians };
      decrement = dot(grad, step, m);
      scratch.last.decrement = decrement / scale0;
    }
    const relative = decrement / scale0;
    const atRounding = !chord && relative / 2 <= ROUNDING;
    const predicted = chord ? chordFrom * relative : relative * relative;
    // The step that ends the solve (if taken in full) gets its image exactly as the solver's working
    // set computes it (designImage), so the gap check at the polished point finds its residual kept.
    const ending = atRounding || predicted <= FINAL * FINAL;
    // Otherwise eta moves by -scale * (X_A d + d_0), the step's image.
    if (!ending) imageOf(x, n, offsets, step, scratch.direction);
    let scale = 1;
    let accepted = false;
    let trialLoss = NaN;
    for (let half = 0; half < 40; half++, scale /= 2) {
      for (let q = 0; q < m; q++) trial[q] = beta[q] - scale * step[q];
      if (ending) {
        for (let q = 0; q < last; q++) full[active[q]] = trial[q];
        full[k] = trial[last];
        designImage(problem, ws, full, scratch.trialEta, trial[last]);
      } else moveAlong(scratch.eta, scratch.direction, -scale, scratch.trialEta, n);
      trialLoss = logisticRows(scratch.trialEta, y, n, scratch.trialResidual, scratch.trialWeight) / n;
      const candidate = trialLoss + penaltyOf(trial);
      // A chord step below the value's rounding is taken like a Newton step there (ROUNDING).
      if (candidate <= value || ((atRounding || (chord && relative / 2 <= ROUNDING)) && Number.isFinite(candidate))) {
        value = Math.min(value, candidate);
        accepted = true;
        break;
      }
    }
    if (!accepted) {
      done = true;
      break;
    }
    let moved = false;
    for (let q = 0; q < m; q++) if (Math.abs(trial[q] - beta[q]) > 1e-13 * Math.max(1, Math.abs(beta[q]))) moved = true;
    beta.set(trial);
    scratch.accept();
    loss = trialLoss;
    if (ending) scratch.exact?.(scratch.eta, scratch.residual, loss);
    const whole = scale === 1;
    if (!moved || atRounding || (whole && predicted <= FINAL * FINAL)) {
      done = true;
      break;
    }
    if (!whole || (chord && chordFrom > CHORD)) chordFrom = 0;
    else if (!chord && relative <= CHORD) chordFrom = relative;
    previous = decrement;
  }
  if (!done || !Number.isFinite(value) || !factor) return { ok: false, steps, hessians };
  recordTangent(memory, lambda, features, signs, beta, factor, linear, ridge);
  out.fill(0, 0, k);
  for (let q = 0; q < last; q++) out[active[q]] = beta[q];
  out[k] = beta[last];
  scratch.solution = out.slice(0, ws.size);
  scratch.loss = loss;
  scratch.features = ws.features;
  return { ok: true, steps, hessians };
}
function dot(a: Float64Array, b: Float64Array, m: number): number {
  let s = 0;
  for (let q = 0; q < m; q++) s += a[q] * b[q];
  return s;
}
