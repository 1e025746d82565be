/**
 * Proximal operators: tiny pure functions (Parikh & Boyd 2014, "Proximal Algorithms", section 6).
 */

/** prox of t|.|: sign(z)(|z| - t)_+ */
export function softThreshold(z: number, t: number): number {
  return z > t ? z - t : z < -t ? z + t : 0;
}

/** prox of t(a|.| + (1 - a)/2 (.)^2) (elastic net, Zou & Hastie 2005): soft threshold, then shrink. */
export function proxElasticNet(z: number, t: number, alpha: number): number {
  return softThreshold(z, t * alpha) / (1 + t * (1 - alpha));
}

/**
 * Block version of the elastic-net prox: t(a||.||_2 + (1 - a)/2 ||.||^2) on z[from..to), in place
 * into out. a = 1 is the group lasso's block soft threshold (Yuan & Lin 2006): (1 - t/||z||)_+ z.
 */
export function proxBlock(z: Float64Array, out: Float64Array, from: number, to: number, t: number, alpha: number): void {
  let sq = 0;
  for (let i = from; i < to; i++) sq += z[i] * z[i];
  const norm = Math.sqrt(sq);
  const keep = norm > t * alpha ? (1 - (t * alpha) / norm) / (1 + t * (1 - alpha)) : 0;
  for (let i = from; i < to; i++) out[i] = keep * z[i];
}
