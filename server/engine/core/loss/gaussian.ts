import { SemidefiniteSolver } from '../gram';
import { blockConjugate } from '../penalty';
import type { Problem, WorkingSet } from '../problem';
import { SupportSystem, type GramEntries } from '../supportSystem';
import { designGramNorm, designImage, designTranspose, fullImage, powerIteration, transposeColumns, transposeTimes } from './design';
import { normOf, scaleScope } from './dualSteps';
import { FREE, type BoundLoss, type DualProjection, type Evaluation, type ResidualPoint, type LossRole, type NullFit, type SupportMemory, type SupportProblem } from './role';

/**
 * Gaussian loss 1/(2n) ||yc - X b||^2 on centred columns (the intercept is mean(y) - centers'b in
 * closed form), in two forms: the design form works on X; the Gram form on G = X'X/n and c = X'yc/n
 * (docs/decisions/0015-gram-form.md says when each is used). Its dual (Fenchel; Ndiaye et al. 2017,
 * JMLR 18, section 2): D(theta) = yc'theta - n/2 ||theta||^2 - sum_u P_u*(X_u'theta).
 */
export function gaussianLoss(problem: Problem, form: 'design' | 'gram'): LossRole {
  const shared = {
    family: 'gaussian' as const,
    form,
    intercept: false,
    dualConcavity: problem.n,
    nullObjective: problem.yy / (2 * problem.n),
    nullFit: (unpenalized: Int32Array) => nullFit(problem, unpenalized),
    dual: (projection: DualProjection) => dual(problem, projection),
    solveOnSupport: (support: SupportProblem, out: Float64Array, _maxSteps: number, memory: SupportMemory) => ({
      ok: solveOnSupport(problem, form, support, out, memory),
      steps: 1,
    }),
  };
  if (form === 'gram') {
    return {
      ...shared,
      bind: (ws) => bindGram(problem, ws),
      evaluate: (coef) => evaluateGram(problem, coef),
      negativeGradient: (ws, active, w) => negativeGradientGram(problem, ws, active, w),
    };
  }
  return {
    ...shared,
    bind: (ws) => bindDesign(problem, ws),
    evaluate: (coef) => evaluateDesign(problem, coef),
    residualAt: (coef, _intercept, image) => residualDesign(problem, coef, image),
    negativeGradient: (ws, active, w, memory) => negativeGradientDesign(problem, ws, active, w, memory),
  };
}

function bindDesign(problem: Problem, ws: WorkingSet): BoundLoss {
  const { n, y } = problem;
  const residual = new Float64Array(n);
  return {
    imageSize: n,
    image: (w, out) => designImage(problem, ws, w, out, 0),
    value(img) {
      let s = 0;
      for (let i = 0; i < n; i++) {
        const r = y[i] - img[i];
        s += r * r;
      }
      return s / (2 * n);
    },
    gradient(img, _w, out) {
      for (let i = 0; i < n; i++) residual[i] = img[i] - y[i];
      designTranspose(problem, ws, residual, out, 1 / n);
    },
    gradientOn(img, _w, out, positions, count) {
      for (let i = 0; i < n; i++) residual[i] = img[i] - y[i];
      const columns = new Int32Array(count);
      for (let q = 0; q < count; q++) columns[q] = ws.features[positions[q]];
      transposeColumns(problem.x, n, columns, count, residual, out, positions);
      for (let q = 0; q < count; q++) out[positions[q]] *= 1 / n;
    },
    lipschitz: () => designGramNorm(problem, ws),
    residual(img) {
      let ycTheta = 0;
      for (let i = 0; i < n; i++) ycTheta += (y[i] * (y[i] - img[i])) / n;
      return { ycTheta, theta: null };
    },
  };
}

function bindGram(problem: Problem, ws: WorkingSet): BoundLoss {
  const k = ws.k;
  const g = new Float64Array(k * k);
  const c = new Float64Array(k);
  problem.gram.ensure(ws.features);
  for (let b = 0; b < k; b++) {
    const col = problem.gram.column(ws.features[b]);
    c[b] = problem.c[ws.features[b]];
    for (let a = 0; a < k; a++) g[b * k + a] = col[ws.features[a]];
  }
  // out = G_WW w, the non-zero entries of w four at a time: each pass over out adds four columns (a
  // quarter of the loads and stores of one column per pass; about 2x faster at 20 to 180 working
  // columns, measured alone on this machine).
  const nonzero = new Int32Array(k);
  const multiply = (w: Float64Array, out: Float64Array): void => {
    out.fill(0);
    let count = 0;
    for (let b = 0; b < k; b++) if (w[b] !== 0) nonzero[count++] = b;
    let t = 0;
    for (; t + 4 <= count; t += 4) {
      const b0 = nonzero[t], b1 = nonzero[t + 1], b2 = nonzero[t + 2], b3 = nonzero[t + 3];
      const c0 = w[b0], c1 = w[b1], c2 = w[b2], c3 = w[b3];
      const o0 = b0 * k, o1 = b1 * k, o2 = b2 * k, o3 = b3 * k;
      for (let a = 0; a < k; a++) out[a] += c0 * g[o0 + a] + c1 * g[o1 + a] + c2 * g[o2 + a] + c3 * g[o3 + a];
    }
    for (; t < count; t++) {
      const coef = w[nonzero[t]];
      const off = nonzero[t] * k;
      for (let a = 0; a < k; a++) out[a] += coef * g[off + a];
    }
  };
  return {
    imageSize: k,
    image: multiply,
    value(img, w) {
      let s = 0;
      for (let b = 0; b < k; b++) s += w[b] * (0.5 * img[b] - c[b]);
      return problem.yy / (2 * problem.n) + s;
    },
    gradient(img, _w, out) {
      for (let b = 0; b < k; b++) out[b] = img[b] - c[b];
    },
    lipschitz: () => powerIteration(k, multiply),
    residual(_img, w) {
      let ycTheta = problem.yy / problem.n;
      for (let b = 0; b < k; b++) ycTheta -= c[b] * w[b];
      return { ycTheta, theta: null };
    },
  };
}

function evaluateDesign(problem: Problem, coef: Float64Array): Evaluation {
  const { loss, theta, residual } = residualDesign(problem, coef);
  const g = new Float64Array(problem.p);
  transposeTimes(problem.x, problem.n, problem.p, theta, g);
  return { loss, g, residual };
}

/** The loss, theta_raw = (yc - X b)/n and yc'theta_raw at b (one product with the non-zero columns). */
function residualDesign(problem: Problem, coef: Float64Array, image?: Float64Array): ResidualPoint {
  const { n, y } = problem;
  const eta = image ?? fullImage(problem, coef, 0);
  const theta = new Float64Array(n);
  let loss = 0;
  let ycTheta = 0;
  for (let i = 0; i < n; i++) {
    const r = y[i] - eta[i];
    loss += r * r;
    ycTheta += (y[i] * r) / n;
    theta[i] = r / n;
  }
  return { loss: loss / (2 * n), theta, residual: { ycTheta, theta: null }, image: eta };
}

/** One product with the Gram columns of the non-zero coefficients. */
function evaluateGram(problem: Problem, coef: Float64Array): Evaluation {
  const { n, p } = problem;
  const g = Float64Array.from(problem.c);
  let cb = 0;
  const nonzero: number[] = [];
  for (let k = 0; k < p; k++) {
    if (coef[k] === 0) continue;
    cb += problem.c[k] * coef[k];
    nonzero.push(k);
  }
  // Four Gram columns per pass over g (as bindGram's multiply).
  let t = 0;
  for (; t + 4 <= nonzero.length; t += 4) {
    const k0 = nonzero[t], k1 = nonzero[t + 1], k2 = nonzero[t + 2], k3 = nonzero[t + 3];
    const c0 = coef[k0], c1 = coef[k1], c2 = coef[k2], c3 = coef[k3];
    const col0 = problem.gram.column(k0), col1 = problem.gram.column(k1), col2 = problem.gram.column(k2), col3 = problem.gram.column(k3);
    for (let j = 0; j < p; j++) g[j] -= col0[j] * c0 + col1[j] * c1 + col2[j] * c2 + col3[j] * c3;
  }
  for (; t < nonzero.length; t++) {
    const beta = coef[nonzero[t]];
    const col = problem.gram.column(nonzero[t]);
    for (let j = 0; j < p; j++) g[j] -= col[j] * beta;
  }
  // b'Gb = b'(c - g)
  let bGb = 0;
  for (let k = 0; k < p; k++) if (coef[k] !== 0) bGb += coef[k] * (problem.c[k] - g[k]);
  return { loss: problem.yy / (2 * n) - cb + 0.5 * bGb, g, residual: { ycTheta: problem.yy / n - cb, theta: null } };
}

/** Least squares on U through G_UU (centred columns, so the intercept is mean(y)). */
function nullFit(problem: Problem, unpenalized: Int32Array): NullFit {
  const { p } = problem;
  const m = unpenalized.length;
  const coef = new Float64Array(p);
  if (m > 0) {
    const matrix = new Float64Array(m * m);
    for (let b = 0; b < m; b++) {
      const col = problem.gram.column(unpenalized[b]);
      for (let a = 0; a < m; a++) matrix[b * m + a] = col[unpenalized[a]];
    }
    const solution = new Float64Array(m);
    const rhs = new Float64Array(m);
    for (let b = 0; b < m; b++) rhs[b] = problem.c[unpenalized[b]];
    new SemidefiniteSolver(matrix, m).solve(rhs, solution);
    for (let b = 0; b < m; b++) coef[unpenalized[b]] = solution[b];
  }
  const g = Float64Array.from(problem.c);
  for (let b = 0; b < m; b++) {
    const col = problem.gram.column(unpenalized[b]);
    const beta = coef[unpenalized[b]];
    for (let j = 0; j < p; j++) g[j] -= col[j] * beta;
  }
  return { coef, intercept: 0, g, theta: null };
}

/**
 * theta = tau theta_proj moves towards the anchor 0, which is always feasible; with alpha = 1 tau is
 * the largest step keeping every ||X_u'theta|| <= lambda w_u, with alpha < 1 the conjugate is finite
 * everywhere and tau = 1. D = tau A - n/2 tau^2 B - conj, A = yc'theta, B = ||theta||^2 (from the
 * loss: ||yc - Xb||^2 / n^2 = 2 loss / n, minus what the projection removed).
 */
function dual(problem: Problem, d: DualProjection): number {
  const pen = problem.penalty;
  const { lambda, blocks, a } = d;
  const { n } = problem;
  const alpha = pen.alpha;
  const A = d.residual.ycTheta - d.ycShift;
  const B = (2 * d.loss) / n - d.normShift / n;
  let tau = 1;
  if (alpha >= 1 && lambda > 0) {
    for (let b = 0; b < blocks.length; b++) {
      const u = blocks[b];
      if (pen.weight[u] === 0) continue;
      const norm = normOf(pen.start, pen.features, u, a);
      if (norm > lambda * pen.weight[u]) tau = Math.min(tau, (lambda * pen.weight[u]) / norm);
    }
  }
  let conj = 0;
  if (alpha < 1 && lambda > 0) {
    for (let b = 0; b < blocks.length; b++) {
      const u = blocks[b];
      if (pen.weight[u] > 0) conj += blockConjugate(tau * normOf(pen.start, pen.features, u, a), lambda, pen.weight[u], alpha);
    }
  }
  scaleScope(pen.start, pen.features, blocks, a, tau, null, 0);
  return tau * A - (n / 2) * tau * tau * Math.max(B, 0) - conj;
}

/**
 * Tolerances from which the support solve skips its step of iterative refinement. Unrefined, the
 * Cholesky solution's relative error is about m eps kappa (Higham 2002, 10.1), below 1e-8 up to a
 * condition number near 1e6: the polished point's relative gap then stays far below 1e-6 (the
 * gap moves with the error of the solution on the support), and the gap still decides whether the
 * polished point is taken. Tighter requests keep the refinement's digits.
 */
const REFINE_BELOW = 1e-6;

/**
 * (X_A'X_A/n + diag(l2)) b_A = X_A'yc/n - l1 s exactly, through the support system kept in the
 * path's memory (extended a row at a time as supports change).
 */
function solveOnSupport(problem: Problem, form: 'design' | 'gram', support: SupportProblem, out: Float64Array, memory: SupportMemory): boolean {
  const { ws, active, sign, l1, l2 } = support;
  memory.system ??= form === 'gram' ? new SupportSystem((f, g) => problem.gram.column(f)[g], gramEntries(problem)) : new SupportSystem(columnProduct(problem), columnProducts(problem));
  const m = active.length;
  // Typed arrays: one object shape whatever the support (arrays from map() differ in shape when
  // empty, which cost the optimized polish a deoptimization).
  const features = new Int32Array(m);
  const shifts = new Float64Array(m);
  for (let q = 0; q < m; q++) {
    features[q] = ws.features[active[q]];
    shifts[q] = l2[active[q]];
  }
  const rhs = new Float64Array(m);
  for (let q = 0; q < m; q++) {
    const s = sign[active[q]];
    rhs[q] = problem.c[features[q]] - (s === FREE ? 0 : l1[active[q]] * s);
  }
  const solution = new Float64Array(m);
  if (!memory.system.solve(features, shifts, rhs, solution, !(support.tolerance !== undefined && support.tolerance >= REFINE_BELOW))) return false;
  out.fill(0, 0, ws.k);
  for (let q = 0; q < m; q++) out[active[q]] = solution[q];
  return true;
}

/** Gram form: a column's entries against several others, read from its Gram column fetched once. */
function gramEntries(problem: Problem): GramEntries {
  return (f, others, count, out) => {
    const column = problem.gram.column(f);
    for (let t = 0; t < count; t++) out[t] = column[others[t]];
  };
}

/** Design form: the dot product of two columns over n (the same sum order as a Gram entry). */
function columnProduct(problem: Problem): (f: number, g: number) => number {
  const { n, x } = problem;
  return (f, g) => {
    let s = 0;
    const a = f * n;
    const b = g * n;
    for (let i = 0; i < n; i++) s += x[a + i] * x[b + i];
    return s / n;
  };
}

/**
 * columnProduct of f with several columns (transposeColumns with v = x_f: four per pass over x_f,
 * each entry the same left-to-right sum as columnProduct, then divided by n).
 */
function columnProducts(problem: Problem): GramEntries {
  const { n, x } = problem;
  return (f, others, count, out) => {
    transposeColumns(x, n, others, count, x.subarray(f * n, (f + 1) * n), out, null);
    for (let t = 0; t < count; t++) out[t] = out[t] / n;
  };
}

/**
 * x_j'theta for the working columns off the support: the residual once (a product with the support's
 * columns), then one product per column. The polish needs no more: on the support the gradient is
 * what the system solved for.
 */
function negativeGradientDesign(problem: Problem, ws: WorkingSet, active: number[], w: Float64Array, memory?: SupportMemory): Float64Array {
  const { n, x, y } = problem;
  const eta = new Float64Array(n);
  const off = new Uint8Array(ws.k).fill(1);
  const support = new Float64Array(ws.k);
  for (const a of active) {
    off[a] = 0;
    support[a] = w[a];
  }
  designImage(problem, ws, support, eta, 0);
  const image = memory ? Float64Array.from(eta) : null;
  for (let i = 0; i < n; i++) eta[i] = y[i] - eta[i];
  const columns = new Int32Array(ws.k - active.length);
  const slots = new Int32Array(columns.length);
  let count = 0;
  for (let b = 0; b < ws.k; b++) {
    if (!off[b]) continue;
    columns[count] = ws.features[b];
    slots[count++] = b;
  }
  const out = new Float64Array(ws.k);
  transposeColumns(x, n, columns, count, eta, out, slots);
  for (let q = 0; q < count; q++) out[slots[q]] /= n;
  // Kept for the gap at this point (solveAtLambda.ts): its image and these products need no redoing.
  if (memory && image) memory.last = { w: support, image, known: off, values: out };
  return out;
}

/** As negativeGradientDesign, from the Gram columns of the support. */
function negativeGradientGram(problem: Problem, ws: WorkingSet, active: number[], w: Float64Array): Float64Array {
  const k = ws.k;
  const features = ws.features;
  const g = new Float64Array(k);
  for (let b = 0; b < k; b++) g[b] = problem.c[features[b]];
  const nonzero: number[] = [];
  for (const a of active) if (w[a] !== 0) nonzero.push(a);
  // Four support columns per pass over g (as bindGram's multiply).
  let t = 0;
  for (; t + 4 <= nonzero.length; t += 4) {
    const a0 = nonzero[t], a1 = nonzero[t + 1], a2 = nonzero[t + 2], a3 = nonzero[t + 3];
    const c0 = w[a0], c1 = w[a1], c2 = w[a2], c3 = w[a3];
    const col0 = problem.gram.column(features[a0]), col1 = problem.gram.column(features[a1]);
    const col2 = problem.gram.column(features[a2]), col3 = problem.gram.column(features[a3]);
    for (let b = 0; b < k; b++) {
      const f = features[b];
      g[b] -= col0[f] * c0 + col1[f] * c1 + col2[f] * c2 + col3[f] * c3;
    }
  }
  for (; t < nonzero.length; t++) {
    const coef = w[nonzero[t]];
    const col = problem.gram.column(features[nonzero[t]]);
    for (let b = 0; b < k; b++) g[b] -= col[features[b]] * coef;
  }
  return g;
}
