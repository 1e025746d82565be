/** Steps of the dual point shared by the losses (dual.ts builds the point; each loss scales it). */

export function normOf(start: Int32Array, features: Int32Array, u: number, v: Float64Array): number {
  let sq = 0;
  for (let i = start[u]; i < start[u + 1]; i++) sq += v[features[i]] * v[features[i]];
  return Math.sqrt(sq);
}

/** a <- kappa gNull + tau (a - kappa gNull) on the scope's columns. */
export function scaleScope(
  start: Int32Array,
  features: Int32Array,
  blocks: Int32Array,
  a: Float64Array,
  tau: number,
  gNull: Float64Array | null,
  kappa: number,
): void {
  for (let b = 0; b < blocks.length; b++) {
    const u = blocks[b];
    for (let i = start[u]; i < start[u + 1]; i++) {
      const j = features[i];
      const base = gNull ? kappa * gNull[j] : 0;
      a[j] = base + tau * (a[j] - base);
    }
  }
}

/** Largest tau in [0, 1] with ||base + tau (a - base)|| <= radius, base = kappa gNull (feasible). */
export function blockStep(
  start: Int32Array,
  features: Int32Array,
  u: number,
  a: Float64Array,
  gNull: Float64Array,
  kappa: number,
  radius: number,
): number {
  let dd = 0;
  let bd = 0;
  let bb = 0;
  for (let i = start[u]; i < start[u + 1]; i++) {
    const j = features[i];
    const base = kappa * gNull[j];
    const d = a[j] - base;
    dd += d * d;
    bd += base * d;
    bb += base * base;
  }
  const endSq = dd + 2 * bd + bb;
  if (endSq <= radius * radius || dd === 0) return 1;
  const c = bb - radius * radius;
  const root = (-bd + Math.sqrt(Math.max(0, bd * bd - dd * c))) / dd;
  return Math.min(1, Math.max(0, root));
}
