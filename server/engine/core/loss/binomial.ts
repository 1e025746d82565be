import { logisticRows } from '../logisticRows';
import { NewtonScratch, newtonOnSupport } from '../polishNewton';
import { blockConjugate } from '../penalty';
import type { Problem, WorkingSet } from '../problem';
import { designGramNorm, designImage, designTranspose, fullImage, transposeColumns, transposeTimes } from './design';
import { blockStep, normOf, scaleScope } from './dualSteps';
import { FREE, type BoundLoss, type DualProjection, type Evaluation, type LossRole, type NullFit, type SupportMemory } from './role';

/**
 * Binomial (logistic) loss (1/n) sum [log(1 + exp(eta_i)) - y_i eta_i], eta = b0 + X b, design form
 * only; the intercept is the working vector's last slot. Its dual (Ndiaye et al. 2017, JMLR 18):
 *   D(theta) = -(1/n) sum [s log s + (1-s) log(1-s)] - sum_u P_u*(X_u'theta),  s = y - n theta in [0, 1].
 * The curvature is at most 1/4, so the dual is 4n-strongly concave.
 */
export function binomialLoss(problem: Problem): LossRole {
  const { n, y, yMean } = problem;
  const thetaP = new Float64Array(n);
  const entropy = new EntropyMemo(n);
  const scratch = new NewtonScratch(n);
  const memo = new ResidualMemo(problem);
  scratch.exact = (eta, residual, loss) => memo.seed(eta, residual, loss);
  return {
    family: 'binomial',
    form: 'design',
    intercept: true,
    dualConcavity: 4 * n,
    nullObjective: -(yMean * Math.log(yMean) + (1 - yMean) * Math.log1p(-yMean)),
    // Every solve along a binomial path ends at the polish (decision 25): its gap comes first.
    polishFirst: true,
    bind: (ws) => bind(problem, ws, memo),
    evaluate(coef, intercept, image): Evaluation {
      // The full check usually follows a gap check at the same point (same image, to the bit); the
      // solver's image of that point (designImage) sums the same columns in the same order as
      // fullImage, so it is used when given.
      const loss = memo.at(image && image.length === n ? image : fullImage(problem, coef, intercept));
      const theta = new Float64Array(n);
      for (let i = 0; i < n; i++) theta[i] = -memo.residual[i] / n;
      const g = new Float64Array(problem.p);
      transposeTimes(problem.x, n, problem.p, theta, g);
      return { loss, g, residual: { ycTheta: 0, theta } };
    },
    nullFit: (unpenalized, memory) => nullFit(problem, unpenalized, memory, scratch),
    dual: (projection) => dual(problem, projection, thetaP, entropy),
    solveOnSupport: (support, out, maxSteps, memory) => newtonOnSupport(problem, support, out, maxSteps, memory, scratch),
    negativeGradient(ws, active, w) {
      // Right after a Newton solve at w (the polish's KKT check), its residual mu - y is at hand.
      let residual = scratch.residual;
      if (scratch.features !== ws.features || !sameValues(scratch.solution, w)) {
        residual = new Float64Array(n).fill(w[ws.k]);
        for (const a of active) {
          const coef = w[a];
          if (coef === 0) continue;
          const off = ws.features[a] * n;
          for (let i = 0; i < n; i++) residual[i] += coef * problem.x[off + i];
        }
        logisticRows(residual, y, n, residual, null);
      }
      // The polish reads x_j'theta off the support only; the active entries are left 0.
      const onSupport = new Uint8Array(ws.k);
      for (const a of active) onSupport[a] = 1;
      let offCount = 0;
      for (let b = 0; b < ws.k; b++) offCount += 1 - onSupport[b];
      const off = new Int32Array(offCount);
      for (let b = 0, t = 0; b < ws.k; b++) if (!onSupport[b]) off[t++] = ws.features[b];
      const values = new Float64Array(off.length);
      transposeColumns(problem.x, n, off, off.length, residual, values, null);
      const g = new Float64Array(ws.k);
      for (let b = 0, t = 0; b < ws.k; b++) if (!onSupport[b]) g[b] = -values[t++] / n;
      return g;
    },
  };
}

/**
 * The mean loss and the residual mu - y at the last image seen, with a copy of that image. The
 * solver asks for the value, the gradient and the dual residual at the same image (a gap check, a
 * FISTA step's value and gradient at y, the full check after the working set's), so one exp and one
 * log1p per row serve them all; reused only when the image is the same to the bit.
 */
class ResidualMemo {
  readonly residual: Float64Array;
  private readonly seen: Float64Array;
  private valid = false;
  private loss = 0;

  constructor(private readonly problem: Problem) {
    this.residual = new Float64Array(problem.n);
    this.seen = new Float64Array(problem.n);
  }

  /** Keeps what logisticRows gave at eta (mean loss, mu - y), computed elsewhere (the Newton loop). */
  seed(eta: Float64Array, residual: Float64Array, loss: number): void {
    this.seen.set(eta);
    this.residual.set(residual);
    this.loss = loss;
    this.valid = true;
  }

  /** Mean loss at eta; `residual` then holds mu - y there. */
  at(eta: Float64Array): number {
    if (this.valid && sameValues(this.seen, eta)) return this.loss;
    const { n, y } = this.problem;
    this.loss = logisticRows(eta, y, n, this.residual, null) / n;
    this.seen.set(eta);
    this.valid = true;
    return this.loss;
  }
}

/**
 * The dual's entropy sum at the last (projected residual, kappa, tau) seen: the full check right
 * after the solver's gap check at the same point and lambda usually ends at the same dual point
 * (the same box step tau), and then the sum (two logs a row) is the same to the bit.
 */
class EntropyMemo {
  private readonly thetaP: Float64Array;
  private kappa = NaN;
  private tau = NaN;
  private entropy = NaN;

  constructor(n: number) {
    this.thetaP = new Float64Array(n);
  }

  /** The kept sum when kappa, tau and the projected residual are the same to the bit; else NaN. */
  lookup(thetaP: Float64Array, kappa: number, tau: number): number {
    if (kappa !== this.kappa || tau !== this.tau || !sameValues(this.thetaP, thetaP)) return NaN;
    return this.entropy;
  }

  keep(thetaP: Float64Array, kappa: number, tau: number, entropy: number): void {
    this.thetaP.set(thetaP);
    this.kappa = kappa;
    this.tau = tau;
    this.entropy = entropy;
  }
}

function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a.length === 0 || a.length > b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

function bind(problem: Problem, ws: WorkingSet, memo: ResidualMemo): BoundLoss {
  const { n } = problem;
  const k = ws.k;
  const theta = new Float64Array(n);
  return {
    imageSize: n,
    image: (w, out) => designImage(problem, ws, w, out, w[k]),
    value: (img) => memo.at(img),
    gradient(img, _w, out) {
      memo.at(img);
      const { residual } = memo;
      let sum = 0;
      for (let i = 0; i < n; i++) sum += residual[i];
      designTranspose(problem, ws, residual, out, 1 / n);
      out[k] = sum / n;
    },
    // The centred columns are orthogonal to the intercept's column of ones, so the largest
    // eigenvalue of [1 X]'[1 X]/n is max(1, that of X'X/n); the logistic curvature is <= 1/4.
    lipschitz: () => 0.25 * Math.max(1, designGramNorm(problem, ws)),
    residual(img) {
      memo.at(img);
      for (let i = 0; i < n; i++) theta[i] = -memo.residual[i] / n;
      return { ycTheta: 0, theta };
    },
  };
}

/**
 * The intercept alone is logit(mean y); with unpenalized columns U, the same Newton loop as the
 * polish (polishNewton.ts) on (b_U, b0) with every sign free and no penalty.
 */
function nullFit(problem: Problem, unpenalized: Int32Array, memory: SupportMemory, scratch: NewtonScratch): NullFit {
  const { n, p } = problem;
  const m = unpenalized.length;
  const coef = new Float64Array(p);
  const ym = Math.min(Math.max(problem.yMean, 1e-12), 1 - 1e-12);
  let intercept = Math.log(ym / (1 - ym));
  if (m > 0) {
    const ws: WorkingSet = { blocks: new Int32Array(0), blockStart: new Int32Array(1), features: unpenalized, k: m, size: m + 1 };
    const out = new Float64Array(m + 1);
    out[m] = intercept;
    const support = {
      ws,
      active: Array.from({ length: m }, (_, q) => q),
      sign: new Int8Array(m).fill(FREE),
      l1: new Float64Array(m),
      l2: new Float64Array(m),
      lambda: 0,
    };
    if (newtonOnSupport(problem, support, out, NULL_NEWTON_STEPS, memory, scratch).ok) {
      for (let q = 0; q < m; q++) coef[unpenalized[q]] = out[q];
      intercept = out[m];
    }
  }
  const eta = fullImage(problem, coef, intercept);
  const theta = new Float64Array(n);
  logisticRows(eta, problem.y, n, theta, null);
  for (let i = 0; i < n; i++) theta[i] = -theta[i] / n;
  const g = new Float64Array(p);
  transposeTimes(problem.x, n, p, theta, g);
  return { coef, intercept, g, theta };
}

/** Newton converges quadratically; 100 steps only bound a pathological start. */
const NULL_NEWTON_STEPS = 100;

/**
 * The projected residual is centred (1'theta = 0, the intercept) and moved towards the anchor
 * kappa theta_null (kappa < 1 keeps s strictly inside (0, 1) and every block strictly feasible:
 * ||kappa X_u'theta_null|| <= kappa lambda_max w_u < lambda w_u) just far enough to be feasible.
 */
function dual(problem: Problem, d: DualProjection, thetaP: Float64Array, memo: EntropyMemo): number {
  const pen = problem.penalty;
  const { lambda, blocks, a, uCols, delta } = d;
  const { n, x, y } = problem;
  const theta = d.residual.theta as Float64Array;
  const m = uCols.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += theta[i];
  mean /= n;
  for (let i = 0; i < n; i++) thetaP[i] = theta[i] - mean;
  for (let b = 0; b < m; b++) {
    const coef = delta[b] / n;
    if (coef === 0) continue;
    const off = uCols[b] * n;
    for (let i = 0; i < n; i++) thetaP[i] -= coef * x[off + i];
  }
  const anchor = d.nullPoint.theta;
  const kappa = lambda > 0 && anchor ? 0.5 * Math.min(1, lambda / d.nullPoint.lambdaMax) : 0;
  let tau = 1;
  for (let i = 0; i < n; i++) {
    const base = kappa * (anchor ? anchor[i] : 0);
    const e = n * (thetaP[i] - base);
    if (e > 0) tau = Math.min(tau, (y[i] - n * base) / e);
    else if (e < 0) tau = Math.min(tau, (y[i] - 1 - n * base) / e);
  }
  if (pen.alpha >= 1 && lambda > 0) {
    for (let b = 0; b < blocks.length; b++) {
      const u = blocks[b];
      if (pen.weight[u] === 0) continue;
      tau = Math.min(tau, blockStep(pen.start, pen.features, u, a, d.nullPoint.g, kappa, lambda * pen.weight[u]));
    }
  }
  tau = Math.max(0, tau);
  let entropy = memo.lookup(thetaP, kappa, tau);
  if (Number.isNaN(entropy)) {
    entropy = 0;
    for (let i = 0; i < n; i++) {
      const base = kappa * (anchor ? anchor[i] : 0);
      const s = y[i] - n * (base + tau * (thetaP[i] - base));
      if (s > 0 && s < 1) entropy += s * Math.log(s) + (1 - s) * Math.log1p(-s);
    }
    memo.keep(thetaP, kappa, tau, entropy);
  }
  scaleScope(pen.start, pen.features, blocks, a, tau, d.nullPoint.g, kappa);
  let conj = 0;
  if (pen.alpha < 1 && lambda > 0) {
    for (let b = 0; b < blocks.length; b++) {
      const u = blocks[b];
      if (pen.weight[u] > 0) conj += blockConjugate(normOf(pen.start, pen.features, u, a), lambda, pen.weight[u], pen.alpha);
    }
  }
  return -entropy / n - conj;
}
