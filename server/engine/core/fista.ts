import type { SolveStatus, StopRule } from '../types';
import type { BoundLoss } from './loss';

/** What the solver needs: the loss, the prox of step * lambda * P, and the relative duality gap. */
export interface SolverRoles {
  size: number;
  loss: BoundLoss;
  prox(z: Float64Array, out: Float64Array, step: number): void;
  /** Relative duality gap at w (image img); `known`: x_b'theta at w already computed for some positions. */
  gap(w: Float64Array, img: Float64Array, known?: KnownGradient): number;
  /**
   * Optional active-set polish (polish.ts): a candidate computed from w into out, using at most
   * maxSteps linear solves or Newton steps; `steps` counts them (they count as iterations).
   */
  polish?(w: Float64Array, out: Float64Array, maxSteps: number): PolishOutcome;
}

/** x_b'theta (= -gradient) at a point for the working positions b with known[b]. */
export interface KnownGradient {
  known: Uint8Array;
  values: Float64Array;
}

/** What a polish gives back: besides the candidate, its image and part of its gradient when it has them. */
export interface PolishOutcome {
  ok: boolean;
  steps: number;
  image?: Float64Array;
  gradient?: KnownGradient;
}

export interface SolverOptions {
  tolerance: number;
  maxIterations: number;
  /** Check the (costlier) duality gap every this many iterations. */
  checkEvery: number;
  /** Starting Lipschitz estimate (backtracking doubles it when too small). */
  lipschitz: number;
  /** The image of the warm start, when the caller has it (else computed). */
  image?: Float64Array;
  /**
   * Polish the warm start before computing its gap (with roles.polish). For losses whose every solve
   * along a path ends at the polish (binomial, decision 25): the warm start's own gap is then
   * computed only when the polished point misses the tolerance, and the better of the two is kept.
   */
  polishFirst?: boolean;
}

export interface SolverOutcome {
  status: SolveStatus;
  gap: number;
  iterations: number;
  lipschitz: number;
  /** Which point met the tolerance (or why the solver stopped). */
  stoppedBy: StopRule;
  /** The image of the returned point (loss.image of it, as computed for its last gap). */
  image: Float64Array;
}

/**
 * FISTA (Beck & Teboulle 2009, "A fast iterative shrinkage-thresholding algorithm for linear inverse
 * problems", SIAM J. Imaging Sci. 2(1)) with backtracking on the Lipschitz estimate and the
 * gradient-based adaptive restart of O'Donoghue & Candes (2015, "Adaptive restart for accelerated
 * gradient schemes", Found. Comput. Math. 15): momentum is reset when (y_k - x_{k+1})'(x_{k+1} - x_k)
 * > 0. Minimizes loss(w) + lambda P(w) from the warm start in `w`, which receives the solution.
 * Stops when the relative duality gap <= tolerance (checked every `checkEvery` iterations).
 * Stops as soon as the asked tolerance is met, and says by which point (SolverOutcome.stoppedBy):
 * the warm start, the polish, or a FISTA iterate. With roles.polish, the polished point replaces the
 * iterate whenever its duality gap is no larger: tried on the warm start when that does not meet the
 * tolerance, and whenever the sign pattern has held between two gap checks (FISTA then only has to
 * find the support; the gap stays the test). A point that meets the tolerance is returned as it is,
 * not polished further.
 * Reported iterations are FISTA iterations plus the polish's solves; both count against the limit.
 */
export function fista(roles: SolverRoles, w: Float64Array, options: SolverOptions): SolverOutcome {
  const { size, loss } = roles;
  const m = loss.imageSize;
  let x = Float64Array.from(w);
  let imgX = new Float64Array(m);
  if (options.image && options.image.length === m) imgX.set(options.image);
  else loss.image(x, imgX);
  // The iteration's buffers (y = x and its image until the first iteration) are made only when
  // FISTA iterates: most solves along a path end at the warm start or its polish.
  let z = NONE;
  let yv = NONE;
  let grad = NONE;
  let imgZ = NONE;
  let imgY = NONE;
  let lipschitz = options.lipschitz > 0 ? options.lipschitz : 1;
  let t = 1;

  // Where the current x came from, for SolverOutcome.stoppedBy.
  let source: StopRule = 'warm-start';
  const polisher = roles.polish ? new Polisher(size, m) : null;
  let spent = 0;
  let it = 0;
  const polish = (): void => {
    const budget = options.maxIterations - it - spent;
    if (!polisher || !roles.polish || budget <= 0 || !polisher.wants(x)) return;
    let extra: PolishOutcome | null = null;
    const found = polisher.attempt(x, (out) => {
      extra = roles.polish!(x, out, budget);
      spent += extra.steps;
      return extra.ok;
    }, (cand, img) => {
      const given: PolishOutcome | null = extra;
      if (given?.image && given.image.length === m) img.set(given.image);
      else loss.image(cand, img);
      return roles.gap(cand, img, given?.gradient);
    });
    if (!found || !(found.gap <= gap)) return;
    x.set(found.point);
    imgX.set(found.image);
    if (yv !== NONE) {
      yv.set(x);
      imgY.set(imgX);
    }
    t = 1;
    gap = found.gap;
    source = 'polish';
  };
  let gap = Infinity;
  if (polisher && options.polishFirst) {
    // The polish first (SolverOptions.polishFirst): a polished point that meets the tolerance ends
    // the solve without the warm start's gap; otherwise the warm start (kept) is compared with it.
    const start = Float64Array.from(x);
    const startImage = Float64Array.from(imgX);
    polish();
    if (!(gap <= options.tolerance)) {
      const warmGap = roles.gap(start, startImage);
      if (!(gap <= warmGap)) {
        x.set(start);
        imgX.set(startImage);
        gap = warmGap;
        source = 'warm-start';
      }
    }
  } else {
    // The warm start's gap first: along a path, and with a loose tolerance, the previous lambda's
    // solution often meets it already (stoppedBy 'warm-start'); otherwise the polish is tried on it.
    gap = roles.gap(x, imgX);
    if (polisher && !(gap <= options.tolerance)) polish();
  }
  if (!Number.isFinite(gap)) return finish('numerical-failure', gap, 0);
  if (gap <= options.tolerance) return finish('converged', gap, 0);

  if (it + spent < options.maxIterations) {
    z = new Float64Array(size);
    yv = Float64Array.from(x);
    grad = new Float64Array(size);
    imgZ = new Float64Array(m);
    imgY = Float64Array.from(imgX);
  }
  while (it + spent < options.maxIterations) {
    it++;
    const fy = loss.value(imgY, yv);
    loss.gradient(imgY, yv, grad);
    let fz = 0;
    for (;;) {
      const step = 1 / lipschitz;
      for (let i = 0; i < size; i++) z[i] = yv[i] - step * grad[i];
      roles.prox(z, z, step);
      loss.image(z, imgZ);
      fz = loss.value(imgZ, z);
      let linear = 0;
      let sq = 0;
      for (let i = 0; i < size; i++) {
        const d = z[i] - yv[i];
        linear += grad[i] * d;
        sq += d * d;
      }
      // A relative slack of 1e-12 absorbs rounding in fz - fy near the solution.
      if (fz <= fy + linear + 0.5 * lipschitz * sq + 1e-12 * Math.abs(fy)) break;
      if (!Number.isFinite(fz) || lipschitz > 1e300) return finish('numerical-failure', NaN, it);
      lipschitz *= 2;
    }
    let restart = 0;
    for (let i = 0; i < size; i++) restart += (yv[i] - z[i]) * (z[i] - x[i]);
    if (restart > 0) t = 1;
    const tNext = (1 + Math.sqrt(1 + 4 * t * t)) / 2;
    const momentum = (t - 1) / tNext;
    for (let i = 0; i < size; i++) yv[i] = z[i] + momentum * (z[i] - x[i]);
    for (let i = 0; i < m; i++) imgY[i] = imgZ[i] + momentum * (imgZ[i] - imgX[i]);
    [x, z] = [z, x];
    [imgX, imgZ] = [imgZ, imgX];
    t = tNext;

    if (it % options.checkEvery === 0 || it + spent >= options.maxIterations) {
      // Refresh the images now and then so rounding from the linear combinations cannot build up.
      if (it % (10 * options.checkEvery) === 0) {
        loss.image(x, imgX);
        loss.image(yv, imgY);
      }
      gap = roles.gap(x, imgX);
      source = 'gap';
      if (!Number.isFinite(gap)) return finish('numerical-failure', gap, it);
      if (gap <= options.tolerance) return finish('converged', gap, it);
      if (polisher?.stable(x)) polish();
      if (gap <= options.tolerance) return finish('converged', gap, it);
    }
  }
  return finish('iteration-limit', gap, it);

  function finish(status: SolveStatus, finalGap: number, iterations: number): SolverOutcome {
    // After a numerical failure the warm start is kept: never hand back non-finite coefficients.
    if (status !== 'numerical-failure') w.set(x);
    const stoppedBy: StopRule = status === 'converged' ? source : status;
    return { status, gap: finalGap, iterations: iterations + spent, lipschitz, stoppedBy, image: imgX };
  }
}

/** Stands for a buffer not made yet (fista's iteration buffers). */
const NONE = new Float64Array(0);

const MAX_POLISH = 12;

/**
 * When to try the active-set polish: at most MAX_POLISH times per solve, never twice on a sign
 * pattern where it failed, and (between checks) only once the pattern has held since the last check.
 */
class Polisher {
  private readonly candidate: Float64Array;
  private readonly image: Float64Array;
  private previous: Int8Array | null = null;
  private failed: Int8Array | null = null;
  private attempts = 0;

  constructor(size: number, imageSize: number) {
    this.candidate = new Float64Array(size);
    this.image = new Float64Array(imageSize);
  }

  /** Records the pattern at this check; true when it equals the one at the previous check. */
  stable(w: Float64Array): boolean {
    const signs = signsOf(w);
    const same = this.previous !== null && equal(this.previous, signs);
    this.previous = signs;
    return same;
  }

  wants(w: Float64Array): boolean {
    return this.attempts < MAX_POLISH && !(this.failed && equal(this.failed, signsOf(w)));
  }

  attempt(
    w: Float64Array,
    run: (out: Float64Array) => boolean,
    gapAt: (point: Float64Array, image: Float64Array) => number,
  ): { point: Float64Array; image: Float64Array; gap: number } | null {
    this.attempts++;
    if (!run(this.candidate)) {
      this.failed = signsOf(w);
      return null;
    }
    const gap = gapAt(this.candidate, this.image);
    if (!Number.isFinite(gap)) {
      this.failed = signsOf(w);
      return null;
    }
    return { point: this.candidate, image: this.image, gap };
  }
}

function signsOf(w: Float64Array): Int8Array {
  const out = new Int8Array(w.length);
  for (let i = 0; i < w.length; i++) out[i] = Math.sign(w[i]);
  return out;
}

function equal(a: Int8Array, b: Int8Array): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}
