import type { Problem, WorkingSet } from '../problem';

/** Products with the design shared by the losses' design forms. */

/**
 * out = offset + X_W w, four non-zero columns per pass over out (a quarter of the loads and stores of
 * out that one column at a time would take).
 */
export function designImage(problem: Problem, ws: WorkingSet, w: Float64Array, out: Float64Array, offset: number): void {
  out.fill(offset);
  addNonzeroColumns(problem.x, problem.n, ws.features, w, ws.k, out);
}

/**
 * out += sum over b < count with coef[b] != 0 of coef[b] x_{columns[b]} (columns null: column b),
 * four columns per pass over out, then the rest one at a time.
 */
function addNonzeroColumns(x: Float64Array, n: number, columns: Int32Array | null, coef: Float64Array, count: number, out: Float64Array): void {
  const cols = [0, 0, 0, 0];
  const coefs = [0, 0, 0, 0];
  let held = 0;
  for (let b = 0; b < count; b++) {
    if (coef[b] === 0) continue;
    cols[held] = (columns === null ? b : columns[b]) * n;
    coefs[held] = coef[b];
    held++;
    if (held === 4) {
      addFour(x, n, cols, coefs, out);
      held = 0;
    }
  }
  for (let h = 0; h < held; h++) {
    const off = cols[h];
    const c = coefs[h];
    for (let i = 0; i < n; i++) out[i] += c * x[off + i];
  }
}

/** out += sum of four scaled columns of x (offsets into x). */
export function addFour(x: Float64Array, n: number, cols: number[], coefs: number[], out: Float64Array): void {
  const [a0, a1, a2, a3] = cols;
  const [c0, c1, c2, c3] = coefs;
  for (let i = 0; i < n; i++) out[i] += c0 * x[a0 + i] + c1 * x[a1 + i] + c2 * x[a2 + i] + c3 * x[a3 + i];
}

/** out[b] = scale * x_{W_b}' v for every working column (transposeColumns into slots 0..k-1, then scaled). */
export function designTranspose(problem: Problem, ws: WorkingSet, v: Float64Array, out: Float64Array, scale: number): void {
  transposeColumns(problem.x, problem.n, ws.features, ws.k, v, out, null);
  for (let b = 0; b < ws.k; b++) out[b] = scale * out[b];
}

/** eta = offset + X b over every column with b_j != 0 (four columns per pass, as designImage). */
export function fullImage(problem: Problem, coef: Float64Array, offset: number): Float64Array {
  const eta = new Float64Array(problem.n).fill(offset);
  addNonzeroColumns(problem.x, problem.n, null, coef, problem.p, eta);
  return eta;
}

/** Largest eigenvalue of a k x k symmetric operator by 20 power iterations from a fixed start (deterministic). */
export function powerIteration(k: number, multiply: (v: Float64Array, out: Float64Array) => void): number {
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

/** Largest eigenvalue of X_W'X_W/n. */
export function designGramNorm(problem: Problem, ws: WorkingSet): number {
  const eta = new Float64Array(problem.n);
  return powerIteration(ws.k, (v, out) => {
    designImage(problem, ws, v, eta, 0);
    designTranspose(problem, ws, eta, out, 1 / problem.n);
  });
}

/**
 * g = X'v, four columns per pass over v (fewer loads per product); each entry is the same
 * left-to-right sum over rows as a plain dot product.
 */
export function transposeTimes(x: Float64Array, n: number, p: number, v: Float64Array, g: Float64Array): void {
  let j = 0;
  for (; j + 4 <= p; j += 4) {
    const a0 = j * n;
    const a1 = a0 + n;
    const a2 = a1 + n;
    const a3 = a2 + n;
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (let i = 0; i < n; i++) {
      const t = v[i];
      s0 += x[a0 + i] * t;
      s1 += x[a1 + i] * t;
      s2 += x[a2 + i] * t;
      s3 += x[a3 + i] * t;
    }
    g[j] = s0;
    g[j + 1] = s1;
    g[j + 2] = s2;
    g[j + 3] = s3;
  }
  for (; j < p; j++) {
    const off = j * n;
    let s = 0;
    for (let i = 0; i < n; i++) s += x[off + i] * v[i];
    g[j] = s;
  }
}

/**
 * g[j] = x_j'v for the `count` columns j listed in `columns` (other entries untouched), or into
 * g[slots[q]] when slots are given, or into g[q] (slots null: one entry per listed column, in order);
 * four columns per pass over v as transposeTimes, each entry the same left-to-right sum over rows.
 */
export function transposeColumns(
  x: Float64Array,
  n: number,
  columns: Int32Array,
  count: number,
  v: Float64Array,
  g: Float64Array,
  slots: Int32Array | null = columns,
): void {
  let q = 0;
  for (; q + 4 <= count; q += 4) {
    const a0 = columns[q] * n;
    const a1 = columns[q + 1] * n;
    const a2 = columns[q + 2] * n;
    const a3 = columns[q + 3] * n;
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (let i = 0; i < n; i++) {
      const t = v[i];
      s0 += x[a0 + i] * t;
      s1 += x[a1 + i] * t;
      s2 += x[a2 + i] * t;
      s3 += x[a3 + i] * t;
    }
    if (slots === null) {
      g[q] = s0;
      g[q + 1] = s1;
      g[q + 2] = s2;
      g[q + 3] = s3;
    } else {
      g[slots[q]] = s0;
      g[slots[q + 1]] = s1;
      g[slots[q + 2]] = s2;
      g[slots[q + 3]] = s3;
    }
  }
  for (; q < count; q++) {
    const off = columns[q] * n;
    let s = 0;
    for (let i = 0; i < n; i++) s += x[off + i] * v[i];
    g[slots === null ? q : slots[q]] = s;
  }
}

/** x_j'v / n for every working column. */
export function workingTranspose(problem: Problem, ws: WorkingSet, v: Float64Array): Float64Array {
  const g = new Float64Array(ws.k);
  transposeColumns(problem.x, problem.n, ws.features, ws.k, v, g, null);
  for (let b = 0; b < ws.k; b++) g[b] = g[b] / problem.n;
  return g;
}
