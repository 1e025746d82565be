/**
 * Proximal operators: tiny pure functions (Parikh & Boyd 2014, "Proximal Algorithms", section 6).
 */

/**
 * The elastic-net prox on a block (Zou & Hastie 2005 for one column): t(a||.||_2 + (1 - a)/2 ||.||^2) on z[from..to), in place
 * into out. a = 1 is the group lasso's block soft threshold (Yuan & Lin 2006): (1 - t/||z||)_+ z.
 */
export function proxBlock(z: Float64Array, out: Float64Array, from: number, to: number, t: number, alpha: number): void {
  let sq = 0;
  for (let i = from; i < to; i++) sq += z[i] * z[i];
  const norm = Math.sqrt(sq);
  const keep = norm > t * alpha ? (1 - (t * alpha) / norm) / (1 + t * (1 - alpha)) : 0;
  for (let i = from; i < to; i++) out[i] = keep * z[i];
}
