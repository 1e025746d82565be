import { EngineInputError, type CrossProducts, type DesignMatrix } from '../types';
import { GramCache } from './gram';

/**
 * Cross products S = sum_i (x_i - c)(x_i - c)' over some rows of a design, about a fixed centre c
 * (default: the column means of those rows). Sums over disjoint row sets add, so a cross-validation
 * fold's training rows get theirs as S(all rows) - S(held-out rows) at the cost of the held-out rows
 * only (subtractCrossProducts); fitPathOnDesign turns them into the fold's Gram matrix (see
 * gramFromCrossProducts). Centring about c first keeps the sums free of the cancellation that raw
 * sums x_i x_i' suffer when means are large against spreads.
 */
export function crossProducts(
  design: DesignMatrix,
  rows?: ArrayLike<number>,
  center?: Float64Array,
  y?: Float64Array,
  yCenter?: number,
): CrossProducts {
  const { p } = design;
  const count = rows ? rows.length : design.n;
  const row = (i: number): number => (rows ? rows[i] : i);
  const c = center ? Float64Array.from(center) : new Float64Array(p);
  if (!center) {
    for (let j = 0; j < p; j++) {
      let s = 0;
      for (let i = 0; i < count; i++) s += design.x[j * design.n + row(i)];
      c[j] = count > 0 ? s / count : 0;
    }
  }
  const centred = new Float64Array(count * p);
  const colSums = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let sum = 0;
    for (let i = 0; i < count; i++) {
      const v = design.x[j * design.n + row(i)] - c[j];
      centred[j * count + i] = v;
      sum += v;
    }
    colSums[j] = sum;
  }
  const sums = new Float64Array(p * p);
  if (count > 0) {
    const gram = new GramCache(centred, count, p);
    gram.ensure(Int32Array.from({ length: p }, (_, j) => j));
    for (let j = 0; j < p; j++) {
      const col = gram.column(j);
      for (let k = 0; k < p; k++) sums[j * p + k] = col[k] * count;
    }
  }
  if (!y) return { rows: count, center: c, sums, colSums };
  let cy = yCenter ?? 0;
  if (yCenter === undefined) {
    for (let i = 0; i < count; i++) cy += y[row(i)];
    cy = count > 0 ? cy / count : 0;
  }
  const yc = new Float64Array(count);
  let sum = 0;
  let squares = 0;
  for (let i = 0; i < count; i++) {
    yc[i] = y[row(i)] - cy;
    sum += yc[i];
    squares += yc[i] * yc[i];
  }
  const cross = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let s = 0;
    const off = j * count;
    for (let i = 0; i < count; i++) s += centred[off + i] * yc[i];
    cross[j] = s;
  }
  return { rows: count, center: c, sums, colSums, response: { center: cy, sum, cross, squares } };
}

/** S(all) - S(part): the cross products of the remaining rows (same centre required). */
export function subtractCrossProducts(all: CrossProducts, part: CrossProducts): CrossProducts {
  if (all.center.length !== part.center.length || all.center.some((v, j) => v !== part.center[j])) {
    throw new EngineInputError('cross products: both sets must use the same centre', 'crossProducts');
  }
  const sums = new Float64Array(all.sums.length);
  for (let t = 0; t < sums.length; t++) sums[t] = all.sums[t] - part.sums[t];
  const out: CrossProducts = { rows: all.rows - part.rows, center: Float64Array.from(all.center), sums };
  if (all.colSums && part.colSums) out.colSums = Float64Array.from(all.colSums, (v, j) => v - (part.colSums as Float64Array)[j]);
  const [a, b] = [all.response, part.response];
  if (a && b && a.center === b.center) {
    out.response = { center: a.center, sum: a.sum - b.sum, cross: Float64Array.from(a.cross, (v, j) => v - b.cross[j]), squares: a.squares - b.squares };
  }
  return out;
}

/**
 * Presets the Gram cache of the standardized columns from cross products of the same rows:
 * G_jk = (S_jk - n (m_j - c_j)(m_k - c_k)) / (n s_j s_k), m the rows' means and s the scales the
 * standardization learnt (constant columns, scale 0, get zero entries).
 */
export function gramFromCrossProducts(gram: GramCache, cp: CrossProducts, n: number, means: Float64Array, scales: Float64Array): void {
  const p = means.length;
  if (cp.rows !== n || cp.center.length !== p || cp.sums.length !== p * p) {
    throw new EngineInputError(`cross products: expected ${n} rows and ${p} x ${p} sums; got ${cp.rows} rows, ${cp.center.length} centres, ${cp.sums.length} sums`, 'crossProducts');
  }
  const shift = Float64Array.from(means, (m, j) => m - cp.center[j]);
  for (let j = 0; j < p; j++) {
    const col = new Float64Array(p);
    if (scales[j] > 0) {
      for (let k = 0; k < p; k++) {
        if (scales[k] > 0) col[k] = (cp.sums[j * p + k] - n * shift[j] * shift[k]) / (n * scales[j] * scales[k]);
      }
    }
    gram.preset(j, col);
  }
}
