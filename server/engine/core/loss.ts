import type { Problem, WorkingSet } from './problem';
import { sigmoid, softplus } from './problem';

/**
 * The loss role on a working set: the solver sees only a linear "image" of the working vector
 * (eta = X_W w for the design forms, G_WW w for the Gram form), the value and gradient computed from
 * it, and a Lipschitz bound of the gradient. Keeping the image lets FISTA form the extrapolated
 * point's image by a linear combination instead of another product with X.
 */
export interface BoundLoss {
  imageSize: number;
  image(w: Float64Array, out: Float64Array): void;
  value(img: Float64Array, w: Float64Array): number;
  gradient(img: Float64Array, w: Float64Array, out: Float64Array): void;
  /** An estimate of the gradient's Lipschitz constant (backtracking corrects an underestimate). */
  lipschitz(): number;
}

export function bindLoss(problem: Problem, ws: WorkingSet): BoundLoss {
  if (problem.family === 'binomial') return binomialLoss(problem, ws);
  return problem.useGram ? gaussianGramLoss(problem, ws) : gaussianDesignLoss(problem, ws);
}

function designImage(problem: Problem, ws: WorkingSet, w: Float64Array, out: Float64Array, offset: number): void {
  const { n, x } = problem;
  out.fill(offset);
  for (let b = 0; b < ws.k; b++) {
    const coef = w[b];
    if (coef === 0) continue;
    const off = ws.features[b] * n;
    for (let i = 0; i < n; i++) out[i] += coef * x[off + i];
  }
}

/** out[b] = scale * x_{W_b}' v */
function designTranspose(problem: Problem, ws: WorkingSet, v: Float64Array, out: Float64Array, scale: number): void {
  const { n, x } = problem;
  for (let b = 0; b < ws.k; b++) {
    const off = ws.features[b] * n;
    let s = 0;
    for (let i = 0; i < n; i++) s += x[off + i] * v[i];
    out[b] = scale * s;
  }
}

/** Largest eigenvalue of X_W'X_W/n by 20 power iterations from a fixed start (deterministic). */
function powerIteration(k: number, multiply: (v: Float64Array, out: Float64Array) => void): number {
  if (k === 0) return 0;
  let v = new Float64Array(k).fill(1 / Math.sqrt(k));
  let next = new Float64Array(k);
  let estimate = 0;
  for (let it = 0; it < 20; it++) {
    multiply(v, next);
    let norm = 0;
    for (let i = 0; i < k; i++) norm += next[i] * next[i];
    norm = Math.sqrt(norm);
    if (norm === 0) return 0;
    estimate = norm;
    for (let i = 0; i < k; i++) next[i] /= norm;
    [v, next] = [next, v];
  }
  return estimate;
}

function gaussianDesignLoss(problem: Problem, ws: WorkingSet): BoundLoss {
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
    lipschitz() {
      const eta = new Float64Array(n);
      return powerIteration(ws.k, (v, out) => {
        designImage(problem, ws, v, eta, 0);
        designTranspose(problem, ws, eta, out, 1 / n);
      });
    },
  };
}

function gaussianGramLoss(problem: Problem, ws: WorkingSet): BoundLoss {
  const k = ws.k;
  const g = new Float64Array(k * k);
  const c = new Float64Array(k);
  problem.gram.ensure(ws.features);
  for (let b = 0; b < k; b++) {
    const col = problem.gram.column(ws.features[b]);
    c[b] = problem.c[ws.features[b]];
    for (let a = 0; a < k; a++) g[b * k + a] = col[ws.features[a]];
  }
  const multiply = (w: Float64Array, out: Float64Array): void => {
    out.fill(0);
    for (let b = 0; b < k; b++) {
      const coef = w[b];
      if (coef === 0) continue;
      const off = b * k;
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
  };
}

function binomialLoss(problem: Problem, ws: WorkingSet): BoundLoss {
  const { n, y } = problem;
  const k = ws.k;
  const residual = new Float64Array(n);
  return {
    imageSize: n,
    image: (w, out) => designImage(problem, ws, w, out, w[k]),
    value(img) {
      let s = 0;
      for (let i = 0; i < n; i++) s += softplus(img[i]) - y[i] * img[i];
      return s / n;
    },
    gradient(img, _w, out) {
      let sum = 0;
      for (let i = 0; i < n; i++) {
        residual[i] = sigmoid(img[i]) - y[i];
        sum += residual[i];
      }
      designTranspose(problem, ws, residual, out, 1 / n);
      out[k] = sum / n;
    },
    lipschitz() {
      // The centred columns are orthogonal to the intercept's column of ones, so the largest
      // eigenvalue of [1 X]'[1 X]/n is max(1, that of X'X/n); the logistic curvature is <= 1/4.
      const eta = new Float64Array(n);
      const gram = powerIteration(k, (v, out) => {
        designImage(problem, ws, v, eta, 0);
        designTranspose(problem, ws, eta, out, 1 / n);
      });
      return 0.25 * Math.max(1, gram);
    },
  };
}
