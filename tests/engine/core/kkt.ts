/**
 * Independent optimality checks (written apart from the engine, from the objectives in docs/engine.md):
 * standardize X the same documented way, map the reported coefficients to that scale and measure
 * the distance of -gradient to lambda * subdifferential of the penalty (KKT; common practice).
 */
import type { DesignMatrix, PathResult } from '../../../server/engine/types';

export interface KktSetup {
  family: 'gaussian' | 'binomial';
  alpha: number;
  standardize: boolean;
  /** Blocks of columns (lasso/elastic net: singletons) with their weights. */
  blocks: { columns: number[]; weight: number }[];
}

function columnStats(design: DesignMatrix, standardize: boolean): { mean: number[]; sd: number[] } {
  const { n, p, x } = design;
  const mean: number[] = [];
  const sd: number[] = [];
  for (let j = 0; j < p; j++) {
    let m = 0;
    for (let i = 0; i < n; i++) m += x[j * n + i];
    m /= n;
    let v = 0;
    for (let i = 0; i < n; i++) v += (x[j * n + i] - m) ** 2;
    mean.push(m);
    sd.push(standardize ? Math.sqrt(v / n) : 1);
  }
  return { mean, sd };
}

/**
 * Largest KKT residual over all blocks at path index k (on the penalized scale). Without
 * standardization the gradient of a column is in units of that column's spread, so each block's
 * residual is divided by max(1, population sd of its columns) to keep one bound for all scales.
 */
export function kktResidual(design: DesignMatrix, y: Float64Array, result: PathResult, k: number, setup: KktSetup): number {
  const { n, p, x } = design;
  const { sd } = columnStats(design, setup.standardize);
  const rawSd = columnStats(design, true).sd;
  const lambda = result.lambda[k];
  const coef = result.coefficients[k];
  const eta = new Float64Array(n).fill(result.intercept[k]);
  for (let j = 0; j < p; j++) for (let i = 0; i < n; i++) eta[i] += coef[j] * x[j * n + i];
  const resid = new Float64Array(n); // d loss / d eta * n
  for (let i = 0; i < n; i++) resid[i] = setup.family === 'gaussian' ? eta[i] - y[i] : 1 / (1 + Math.exp(-eta[i])) - y[i];
  let interceptGrad = 0;
  for (let i = 0; i < n; i++) interceptGrad += resid[i] / n;
  let worst = Math.abs(interceptGrad);
  // With b~_j = b_j * sd_j the penalized-scale gradient is x_j'resid / (n sd_j).
  const grad = new Float64Array(p);
  const scaled = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += x[j * n + i] * resid[i];
    grad[j] = s / (n * sd[j]);
    scaled[j] = coef[j] * sd[j];
  }
  for (const block of setup.blocks) {
    const cols = block.columns.filter((j) => sd[j] > 0);
    const bNorm = Math.sqrt(cols.reduce((a, j) => a + scaled[j] ** 2, 0));
    const gNorm = Math.sqrt(cols.reduce((a, j) => a + grad[j] ** 2, 0));
    let dist: number;
    if (bNorm === 0) dist = Math.max(0, gNorm - lambda * block.weight * setup.alpha);
    else {
      dist = Math.sqrt(
        cols.reduce((a, j) => a + (grad[j] + lambda * block.weight * ((setup.alpha * scaled[j]) / bNorm + (1 - setup.alpha) * scaled[j])) ** 2, 0),
      );
    }
    const spread = setup.standardize ? 1 : Math.max(1, ...cols.map((j) => rawSd[j]));
    worst = Math.max(worst, dist / spread);
  }
  return worst;
}

/**
 * Gaussian lasso duality gap computed from scratch (e.g. Kim et al. 2007, "An interior-point method
 * for large-scale l1-regularized least squares"; the dual point theta = r/n scaled into the feasible
 * set |X'theta| <= lambda): relative to the null objective ||y - mean y||^2 / (2n).
 */
export function gaussianLassoGap(design: DesignMatrix, y: Float64Array, result: PathResult, k: number, standardize: boolean): number {
  const { n, p, x } = design;
  const { sd } = columnStats(design, standardize);
  const lambda = result.lambda[k];
  const coef = result.coefficients[k];
  const r = new Float64Array(n);
  let ym = 0;
  for (let i = 0; i < n; i++) ym += y[i] / n;
  let nullObj = 0;
  for (let i = 0; i < n; i++) {
    let e = result.intercept[k];
    for (let j = 0; j < p; j++) e += coef[j] * x[j * n + i];
    r[i] = y[i] - e;
    nullObj += (y[i] - ym) ** 2 / (2 * n);
  }
  let loss = 0;
  let l1 = 0;
  let maxCorr = 0;
  for (let i = 0; i < n; i++) loss += (r[i] * r[i]) / (2 * n);
  for (let j = 0; j < p; j++) {
    l1 += Math.abs(coef[j] * sd[j]);
    let s = 0;
    for (let i = 0; i < n; i++) s += x[j * n + i] * r[i];
    maxCorr = Math.max(maxCorr, Math.abs(s / (n * sd[j])));
  }
  const tau = maxCorr > lambda ? lambda / maxCorr : 1;
  let dual = 0;
  for (let i = 0; i < n; i++) {
    const theta = (tau * r[i]) / n;
    dual += (y[i] - ym) * theta - (n / 2) * theta * theta;
  }
  return (loss + lambda * l1 - dual) / nullObj;
}
