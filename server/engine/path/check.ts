import type { DualContext, DualResult } from '../core/dual';
import { transposeColumns } from '../core/loss/design';
import type { Problem } from '../core/problem';

export interface FullCheck {
  /** Relative duality gap of the full problem. */
  gap: number;
  absoluteGap: number;
  /**
   * X'theta_raw = -gradient of the loss, column-indexed (for KKT checks and strong rules). With
   * KktBounds, a column the bounds certify is left at 0: its |x_j'theta_raw| is below the KKT bound
   * (bounds.exact[j] = 0, bounds.bound[j] holds the certificate).
   */
  g: Float64Array;
  loss: number;
  dual: DualResult;
  /** Design forms with a dual residual: X b at the point checked (the next solve's starting image). */
  image?: Float64Array;
}

/**
 * Bounds on |x_j'theta_raw| carried from one full check to the next along a path (path state), so
 * that the check computes x_j'theta_raw only for the columns that can matter. By the triangle
 * inequality (the argument of the Gap Safe spheres, Ndiaye et al. 2017, JMLR 18, section 3, with a
 * multiple of a past check's theta as the centre), |x_j'theta| <= |c| |x_j'theta_ref| + ||x_j||
 * ||theta - c theta_ref|| for any c, where theta_ref is the last theta at which x_j'theta was
 * computed (kept while some column refers to it: the direct distance, not a sum of steps, so the
 * small jitter of approximate solutions does not add up). A block whose bound stays below lambda alpha w_u can neither violate its KKT condition
 * nor change the dual point (the gaussian dual scales theta only for blocks above lambda w_u and
 * counts a conjugate only above lambda alpha w_u, dual.ts), so the full duality gap is the same with
 * or without its product: the check stays exact. Used for losses with a dual residual (design forms,
 * LossRole.residualAt) and no unpenalized columns (whose projection would move every product).
 */
export class KktBounds {
  /** Upper bound on |x_j'theta| at the last check's theta; the computed |x_j'theta| where exact[j]. */
  readonly bound: Float64Array;
  readonly exact: Uint8Array;
  private readonly colNorm: Float64Array;
  private readonly columns: Int32Array;
  /** Past thetas still referred to, each with its norm, its users and its distance to the latest. */
  private refs: Ref[] = [];
  /** Index into refs of the theta where column j was last computed (-1: never), and x_j'theta there. */
  private readonly ref: Int32Array;
  private readonly value: Float64Array;
  /** The same for the computation before that (-1: none): two points of the path to extrapolate from. */
  private readonly ref2: Int32Array;
  private readonly value2: Float64Array;
  /** refs index of the last check's theta, and the g array that check filled (resolve works only on it). */
  private current = -1;
  private g: Float64Array | null = null;
  private readonly buffers: Float64Array[] = [];
  private readonly given: Uint8Array;
  /** The blocks the last update computed (the others are certified below their KKT bound). */
  private readonly checked: Int32Array;
  private checkedCount = 0;

  constructor(private readonly problem: Problem) {
    const p = problem.p;
    this.bound = new Float64Array(p);
    this.exact = new Uint8Array(p);
    this.colNorm = Float64Array.from(problem.colNormSq, Math.sqrt);
    this.columns = new Int32Array(p);
    this.ref = new Int32Array(p).fill(-1);
    this.value = new Float64Array(p);
    this.ref2 = new Int32Array(p).fill(-1);
    this.value2 = new Float64Array(p);
    this.given = new Uint8Array(p);
    this.checked = new Int32Array(problem.penalty.nBlocks);
  }

  /**
   * The blocks whose x_j'theta the last update computed: the only ones that can move the dual point
   * or add a conjugate (a certified block has g = 0 there and |x_u'theta| below lambda alpha w_u).
   */
  checkedBlocks(): Int32Array {
    return this.checked.subarray(0, this.checkedCount);
  }

  /**
   * A p-long vector for the next check's X'theta: two alternate, so the last check's (the path
   * state's g, which resolve may still complete) is never the one written.
   */
  nextBuffer(): Float64Array {
    const free = this.buffers.find((b) => b !== this.g);
    if (free) return free;
    const fresh = new Float64Array(this.problem.p);
    this.buffers.push(fresh);
    return fresh;
  }

  /** True when g is the last check's and x_j'theta was computed there for every one of `features`. */
  exactOn(g: Float64Array, features: Int32Array): boolean {
    if (g !== this.g) return false;
    for (let q = 0; q < features.length; q++) if (!this.exact[features[q]]) return false;
    return true;
  }

  /** After a check without bounds: the next check computes every column. */
  invalidate(): void {
    this.refs = [];
    this.ref.fill(-1);
    this.ref2.fill(-1);
    this.current = -1;
    this.g = null;
    this.exact.fill(1);
  }

  /**
   * Bounds at `theta`; computes x_j'theta (into g, bound and exact) for the columns of every block
   * whose bound reaches lambda alpha w_u, or of every block when `all`.
   */
  update(theta: Float64Array, lambda: number, g: Float64Array, all: boolean, given?: KnownProducts): void {
    const { problem, bound, exact, colNorm, ref, value } = this;
    const pen = problem.penalty;
    const n = theta.length;
    if (all) this.invalidate();
    const at = this.addRef(theta);
    for (const r of this.refs) {
      if (r.users === 0 || r === this.refs[at]) continue;
      // Along a path theta shrinks with lambda much more than it turns: the bound is taken from the
      // closest multiple c theta_ref, |x_j'theta| <= |c| |x_j'theta_ref| + ||x_j|| ||theta - c theta_ref||.
      let dot = 0;
      for (let i = 0; i < n; i++) dot += theta[i] * r.theta[i];
      const c = r.norm > 0 ? dot / (r.norm * r.norm) : 0;
      let sq = 0;
      for (let i = 0; i < n; i++) {
        const d = theta[i] - c * r.theta[i];
        sq += d * d;
      }
      r.factor = Math.abs(c);
      r.dot = dot;
      // Rounding of the dot products (at most n eps ||x_j|| ||theta|| each, Higham 2002, 3.1) and of
      // the distance itself, with a wide margin: a certified column is never a rounding call.
      r.move = Math.sqrt(sq) + ROUNDING_MARGIN * n * Number.EPSILON * (r.factor * r.norm + this.refs[at].norm);
    }
    const pairs: (Plane | null | undefined)[] = new Array(this.refs.length * this.refs.length);
    let count = 0;
    this.checkedCount = 0;
    for (let u = 0; u < pen.nBlocks; u++) {
      let sq = 0;
      let known = pen.weight[u] > 0;
      for (let i = pen.start[u]; i < pen.start[u + 1] && known; i++) {
        const j = pen.features[i];
        if (ref[j] < 0) known = false;
        else {
          let b = this.refs[ref[j]].factor * Math.abs(value[j]) + colNorm[j] * this.refs[ref[j]].move;
          if (this.ref2[j] >= 0) {
            const pair = this.pair(theta, ref[j], this.ref2[j], pairs);
            if (pair) b = Math.min(b, Math.abs(pair.a * value[j] + pair.b * this.value2[j]) + colNorm[j] * pair.move);
          }
          bound[j] = b;
          sq += b * b;
        }
      }
      if (known && Math.sqrt(sq) < lambda * pen.alpha * pen.weight[u]) {
        for (let i = pen.start[u]; i < pen.start[u + 1]; i++) {
          exact[pen.features[i]] = 0;
          g[pen.features[i]] = 0;
        }
      } else {
        this.checked[this.checkedCount++] = u;
        for (let i = pen.start[u]; i < pen.start[u + 1]; i++) this.columns[count++] = pen.features[i];
      }
    }
    this.compute(count, g, at, given);
    this.current = at;
    this.g = g;
    this.dropUnused();
  }

  /**
   * The closest point a theta_1 + b theta_2 of the plane through the origin and two past thetas (the
   * path moves nearly along it from one lambda to the next, so the distance is far smaller than to
   * either): |x_j'theta| <= |a x_j'theta_1 + b x_j'theta_2| + ||x_j|| ||theta - a theta_1 - b theta_2||.
   * null when the two are too close to parallel for the 2 x 2 normal equations.
   */
  private pair(theta: Float64Array, r1: number, r2: number, cache: (Plane | null | undefined)[]): Plane | null {
    const key = r1 * this.refs.length + r2;
    const cached = cache[key];
    if (cached !== undefined) return cached;
    const one = this.refs[r1];
    const two = this.refs[r2];
    const n = theta.length;
    // theta_1'theta_2 once per pair of thetas (pairs recur from check to check).
    let d12 = one.dots.get(two);
    if (d12 === undefined) {
      d12 = 0;
      for (let i = 0; i < n; i++) d12 += one.theta[i] * two.theta[i];
      one.dots.set(two, d12);
    }
    const d11 = one.norm * one.norm;
    const d22 = two.norm * two.norm;
    const det = d11 * d22 - d12 * d12;
    let result: Plane | null = null;
    if (det > PARALLEL * d11 * d22) {
      const a = (one.dot * d22 - two.dot * d12) / det;
      const b = (two.dot * d11 - one.dot * d12) / det;
      const norm = this.refs[this.refs.length - 1].norm;
      // ||theta - a theta_1 - b theta_2||^2 from the inner products already at hand. It cancels when
      // small; the error of the sum and of its n-long inner products is below (n + 8) eps S^2
      // (S = ||theta|| + |a| ||theta_1|| + |b| ||theta_2||; Higham 2002, 3.1), added twice over.
      const scale = norm + Math.abs(a) * one.norm + Math.abs(b) * two.norm;
      const sq = norm * norm - 2 * a * one.dot - 2 * b * two.dot + a * a * d11 + 2 * a * b * d12 + b * b * d22;
      const slack = 2 * (n + 8) * Number.EPSILON * scale * scale;
      const move = Math.sqrt(Math.max(0, sq) + slack) + ROUNDING_MARGIN * n * Number.EPSILON * scale;
      result = { a, b, move };
    }
    cache[key] = result;
    return result;
  }

  /**
   * Makes g exact (at the last check's theta) on every block whose bound reaches `threshold(u)`:
   * the strong rule then sees the same numbers as with a full check.
   */
  resolve(g: Float64Array, threshold: (u: number) => number): void {
    const { problem, bound, exact } = this;
    const pen = problem.penalty;
    // A g from elsewhere (the null fit, a check without bounds) is exact everywhere.
    if (g !== this.g) this.invalidate();
    if (this.current < 0) return;
    let count = 0;
    for (let u = 0; u < pen.nBlocks; u++) {
      let sq = 0;
      let inexact = false;
      for (let i = pen.start[u]; i < pen.start[u + 1]; i++) {
        const j = pen.features[i];
        sq += bound[j] * bound[j];
        if (!exact[j]) inexact = true;
      }
      if (!inexact || Math.sqrt(sq) < threshold(u)) continue;
      for (let i = pen.start[u]; i < pen.start[u + 1]; i++) if (!exact[pen.features[i]]) this.columns[count++] = pen.features[i];
    }
    this.compute(count, g, this.current);
    this.dropUnused();
  }

  /**
   * x_j'theta for the first `count` of `columns` at refs[at] (taken from `given` where it has them);
   * those columns now refer to it.
   */
  private compute(count: number, g: Float64Array, at: number, given?: KnownProducts): void {
    const { problem, bound, exact, ref, value, columns } = this;
    const target = this.refs[at];
    let todo = count;
    if (given) {
      const mark = this.given;
      for (let q = 0; q < given.count; q++) mark[given.features[q]] = 1;
      // Columns the caller has go to the end of the list, the others are computed.
      let front = 0;
      let back = count;
      while (front < back) {
        if (mark[columns[front]]) {
          back--;
          const t = columns[front];
          columns[front] = columns[back];
          columns[back] = t;
        } else front++;
      }
      todo = front;
      for (let q = todo; q < count; q++) g[columns[q]] = given.values[columns[q]];
      for (let q = 0; q < given.count; q++) mark[given.features[q]] = 0;
    }
    transposeColumns(problem.x, target.theta.length, columns, todo, target.theta, g);
    const { ref2, value2 } = this;
    for (let q = 0; q < count; q++) {
      const j = columns[q];
      // The previous computation becomes the second point (its ref keeps its user).
      if (ref2[j] >= 0) this.refs[ref2[j]].users--;
      ref2[j] = ref[j];
      value2[j] = value[j];
      ref[j] = at;
      target.users++;
      value[j] = g[j];
      bound[j] = Math.abs(g[j]);
      exact[j] = 1;
    }
  }

  private addRef(theta: Float64Array): number {
    let norm = 0;
    for (let i = 0; i < theta.length; i++) norm += theta[i] * theta[i];
    this.refs.push({ theta: Float64Array.from(theta), norm: Math.sqrt(norm), users: 0, factor: 1, move: 0, dot: 0, dots: new Map() });
    return this.refs.length - 1;
  }

  /** Forgets the thetas no column refers to (keeping the last check's, which resolve may use). */
  private dropUnused(): void {
    if (this.refs.every((r, k) => r.users > 0 || k === this.current)) return;
    const index = new Int32Array(this.refs.length).fill(-1);
    const kept: typeof this.refs = [];
    this.refs.forEach((r, k) => {
      if (r.users > 0 || k === this.current) {
        index[k] = kept.length;
        kept.push(r);
      }
    });
    for (let j = 0; j < this.ref.length; j++) {
      if (this.ref[j] >= 0) this.ref[j] = index[this.ref[j]];
      if (this.ref2[j] >= 0) this.ref2[j] = index[this.ref2[j]];
    }
    this.current = index[this.current];
    // The cached inner products with forgotten thetas go too (they would keep those thetas alive).
    this.refs.forEach((r, k) => {
      if (index[k] < 0) for (const other of kept) other.dots.delete(r);
    });
    this.refs = kept;
  }
}

/**
 * x_j'theta_raw at the point being checked, already computed by the solver (the working set's
 * gradient at its last gap evaluation): values column-indexed, for features[0..count).
 */
export interface KnownProducts {
  features: Int32Array;
  count: number;
  values: Float64Array;
}

/** A past theta the bounds refer to: its norm, users, and its relation to the latest theta. */
interface Ref {
  theta: Float64Array;
  norm: number;
  /** Columns whose ref or ref2 it is. */
  users: number;
  /** |c| and ||theta - c theta_ref|| (with the rounding margin) for the closest multiple c. */
  factor: number;
  move: number;
  /** theta'theta_ref for the latest theta, and theta_ref'theta_other for other refs (cached). */
  dot: number;
  dots: Map<Ref, number>;
}

/** The closest point a theta_1 + b theta_2 of a plane of two past thetas, and the distance to it. */
interface Plane {
  a: number;
  b: number;
  move: number;
}

/** Below this relative determinant the two thetas count as parallel (the one-theta bound serves). */
const PARALLEL = 1e-8;

/** Multiple of n eps ||x_j|| ||theta|| added to every move of the bounds (see KktBounds.update). */
const ROUNDING_MARGIN = 4;

/**
 * Loss, gradient and duality gap of the full problem at (coef, intercept): the loss evaluates
 * (design form: one product with X, on the columns `bounds` cannot certify; Gram form: with the
 * Gram columns of the non-zero coefficients), the dual context builds the dual point.
 */
export function checkFull(
  problem: Problem,
  dual: DualContext,
  allBlocks: Int32Array,
  allStart: Int32Array,
  coef: Float64Array,
  intercept: number,
  lambda: number,
  bounds?: KktBounds,
  given?: KnownProducts,
  image?: Float64Array,
): FullCheck {
  let loss: number;
  let g: Float64Array;
  let residual;
  let checked: Float64Array | undefined;
  let scope = allBlocks;
  const residualAt = problem.loss.residualAt;
  if (bounds && residualAt && dual.unpenalized(lambda).length === 0) {
    const at = residualAt(coef, intercept, image);
    checked = at.image;
    ({ loss, residual } = at);
    g = bounds.nextBuffer();
    bounds.update(at.theta, lambda, g, lambda === 0, given);
    scope = bounds.checkedBlocks();
  } else {
    ({ loss, g, residual } = problem.loss.evaluate(coef, intercept, image));
    bounds?.invalidate();
  }
  const penalty = fullPenalty(problem, allBlocks, allStart, coef, lambda);
  const result = dual.gap({ lambda, blocks: scope, g, loss, penalty, residual });
  return { gap: result.gap / problem.nullObjective, absoluteGap: result.gap, g, loss, dual: result, image: checked };
}

/** lambda * P(coef) over the blocks (penaltyValue's sums, read from the column-indexed vector). */
function fullPenalty(problem: Problem, blocks: Int32Array, start: Int32Array, coef: Float64Array, lambda: number): number {
  const pen = problem.penalty;
  let total = 0;
  if (start[blocks.length] === blocks.length) {
    // One column per block (lasso, elastic net): the same terms without the inner loop.
    for (let b = 0; b < blocks.length; b++) {
      const beta = coef[pen.features[b]];
      const weight = pen.weight[blocks[b]];
      if (beta === 0 || weight === 0) continue;
      const sq = beta * beta;
      total += weight * (pen.alpha * Math.sqrt(sq) + ((1 - pen.alpha) / 2) * sq);
    }
    return lambda * total;
  }
  for (let b = 0; b < blocks.length; b++) {
    const weight = pen.weight[blocks[b]];
    if (weight === 0) continue;
    let sq = 0;
    for (let i = start[b]; i < start[b + 1]; i++) sq += coef[pen.features[i]] * coef[pen.features[i]];
    if (sq === 0) continue;
    total += weight * (pen.alpha * Math.sqrt(sq) + ((1 - pen.alpha) / 2) * sq);
  }
  return lambda * total;
}
