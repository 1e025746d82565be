import type { DualContext } from '../core/dual';
import { fista, type KnownGradient, type PolishOutcome } from '../core/fista';
import type { SupportMemory } from '../core/loss';
import { blockNorm, penaltyProx, penaltyValue } from '../core/penalty';
import type { Problem, WorkingSet } from '../core/problem';
import { makeWorkingSet } from '../core/problem';
import { polishOnSupport } from '../core/polish';
import type { Screening, SolveInfo, StopRule } from '../types';
import { checkFull, KktBounds, type FullCheck, type KnownProducts } from './check';

/**
 * Everything one path carries from one lambda to the next (explicit state, owned by fitPathOnDesign;
 * nothing is kept in module state).
 */
export interface PathState {
  /** Standardized-scale coefficients (column-indexed), updated in place. */
  coef: Float64Array;
  /** Intercept slot of losses that have one (binomial; standardized scale). */
  intercept: number;
  /** X'theta_raw at the current point (-gradient), from the last full check. */
  g: Float64Array;
  /** Loss value at the current point, from the last full check. */
  loss: number;
  /** Lipschitz estimate carried along the path (0: a power iteration starts it off). */
  lipschitz: number;
  /** The active-set polish's factor and Newton tangent (polish.ts). */
  support: SupportMemory;
  /**
   * Bounds on |x_j'theta| that let the full check skip the columns they certify (check.ts); made on
   * the first check. Where they stand in for the product, `g` holds 0.
   */
  kkt?: KktBounds;
  /** A p-long vector the working-set gap reuses from one lambda to the next. */
  scratch?: Float64Array;
  /** 0, 1, ..., nBlocks - 1 (every block, for the full check), made once per path. */
  allBlocks?: Int32Array;
  /**
   * X b at the last check and the coefficients b it belongs to: the next solve starts from this
   * image when coef still equals b (anything may have moved coef since: screening, a warm start).
   */
  image?: { eta: Float64Array; coef: Float64Array };
}

/**
 * A path's state at its start, with every optional field present (undefined until solveAtLambda
 * and the polish fill them): one object shape for every path's state, so solveAtLambda's optimized
 * code, compiled on one path, is not thrown away ("wrong map" deoptimizations, ~14 per wide
 * 300x1500 CV run before) when the next fold's fresh state arrives without the fields the last one
 * had gained.
 */
export function newPathState(coef: Float64Array, intercept: number, g: Float64Array, loss: number): PathState {
  return {
    coef,
    intercept,
    g,
    loss,
    lipschitz: 0,
    support: { system: undefined, tangent: undefined, last: undefined },
    kkt: undefined,
    scratch: undefined,
    allBlocks: undefined,
    image: undefined,
  };
}

export interface LambdaOptions {
  lambda: number;
  previousLambda: number;
  tolerance: number;
  maxIterations: number;
  screening: Screening;
  polish: boolean;
}

/**
 * FISTA computes the duality gap every CHECK_EVERY iterations. One gap costs about one gradient
 * (a product with the working columns) plus the dual point, so checking every iteration would
 * nearly double the work; every 5 keeps it under ~20% while stopping at most 4 iterations late.
 */
const CHECK_EVERY = 5;
/**
 * Working-set rounds per lambda. Each round either adds at least one block that violates its KKT
 * condition or tightens the inner tolerance tenfold (rounding), so the count is small in practice
 * (1-3); the cap only guards against cycling between two sets, and the iteration limit still applies.
 */
const MAX_ROUNDS = 50;

/**
 * Solves at one lambda from the warm start in `state`. Working set: with 'strong', the sequential
 * strong rule (Tibshirani et al. 2012, "Strong rules for discarding predictors in lasso-type
 * problems", JRSS B 74): keep block u if ||g_u(previous)|| >= w_u alpha (2 lambda - previous
 * lambda), plus the blocks already non-zero and the unpenalized ones; after solving, the KKT
 * conditions are checked on every discarded block and violators are added and the problem re-solved.
 * With 'gap-safe' (Ndiaye et al. 2017, JMLR 18): discard u if ||X_u'theta|| + r ||X_u||_F < lambda
 * alpha w_u, r = sqrt(2 gap / gamma), gamma = n (gaussian) or 4n (binomial) the dual's strong
 * concavity; the same test serves the elastic net (alpha < 1; docs/decisions/0026-gap-safe-elastic-net-and-wide-solves.md).
 * 'none': every block.
 */
export function solveAtLambda(
  problem: Problem,
  dual: DualContext,
  state: PathState,
  options: LambdaOptions,
): SolveInfo {
  const started = performance.now();
  const pen = problem.penalty;
  if (!state.allBlocks || state.allBlocks.length !== pen.nBlocks) state.allBlocks = Int32Array.from({ length: pen.nBlocks }, (_, u) => u);
  const allBlocks = state.allBlocks;
  const { lambda, tolerance } = options;
  const intercept = problem.loss.intercept;
  const keep = new Uint8Array(pen.nBlocks);
  state.kkt ??= new KktBounds(problem);
  if (options.screening === 'none' || lambda === 0) keep.fill(1);
  else if (options.screening === 'gap-safe') gapSafe(problem, dual, state, allBlocks, lambda, keep);
  else {
    const threshold = pen.alpha * (2 * lambda - options.previousLambda);
    // Where the last check left a bound instead of x_j'theta, the rule needs the number only if
    // the bound reaches the threshold.
    state.kkt.resolve(state.g, (u) => pen.weight[u] * threshold);
    const single = pen.start[pen.nBlocks] === pen.nBlocks;
    for (let u = 0; u < pen.nBlocks; u++) {
      if (pen.weight[u] === 0) keep[u] = 1;
      else if (single) {
        // One column per block (lasso, elastic net): the norms are absolute values.
        const j = pen.features[u];
        if (Math.abs(state.g[j]) >= pen.weight[u] * threshold || state.coef[j] !== 0) keep[u] = 1;
      } else if (blockNorm(pen, u, state.g) >= pen.weight[u] * threshold || blockNorm(pen, u, state.coef) > 0) keep[u] = 1;
    }
  }

  let iterations = 0;
  let status: SolveInfo['status'] = 'converged';
  let stoppedBy: StopRule = 'warm-start';
  let check: FullCheck | null = null;
  let restrictedTolerance = tolerance;
  for (let round = 0; round < MAX_ROUNDS; round++) {
    const ws = makeWorkingSet(pen, keptBlocks(keep), intercept);
    const outcome = solveRestricted(problem, dual, ws, state, lambda, {
      polish: options.polish,
      tolerance: restrictedTolerance,
      maxIterations: Math.max(1, options.maxIterations - iterations),
    });
    iterations += outcome.iterations;
    stoppedBy = outcome.stoppedBy;
    const image = outcome.status === 'numerical-failure' ? undefined : outcome.image;
    check = checkFull(problem, dual, allBlocks, pen.start, state.coef, state.intercept, lambda, state.kkt, outcome.known, image);
    keepImage(state, check);
    state.g = check.g;
    state.loss = check.loss;
    if (outcome.status !== 'converged' || !Number.isFinite(check.gap)) {
      status = Number.isFinite(check.gap) && outcome.status !== 'numerical-failure' ? 'iteration-limit' : 'numerical-failure';
      break;
    }
    let violations = 0;
    const single = pen.start[pen.nBlocks] === pen.nBlocks;
    for (let u = 0; u < pen.nBlocks; u++) {
      if (keep[u]) continue;
      // One column per block (lasso, elastic net): the norm is an absolute value.
      const norm = single ? Math.abs(check.g[pen.features[u]]) : blockNorm(pen, u, check.g);
      if (norm > lambda * pen.weight[u] * pen.alpha) {
        keep[u] = 1;
        violations++;
      }
    }
    if (violations === 0) {
      if (check.gap <= tolerance) break;
      // Rounding can leave the full gap a hair above the restricted one: tighten and go again.
      restrictedTolerance /= 10;
    }
    if (iterations >= options.maxIterations) {
      status = check.gap <= tolerance ? 'converged' : 'iteration-limit';
      break;
    }
  }
  const gap = check ? check.gap : NaN;
  if (status === 'converged' && !(gap <= tolerance)) status = 'iteration-limit';
  if (status !== 'converged') stoppedBy = status;
  return {
    status,
    stoppedBy,
    message: describeSolve(status, gap, tolerance, iterations, stoppedBy),
    gap,
    tolerance,
    iterations,
    timeMs: performance.now() - started,
  };
}

const RULE_WORDS: Record<StopRule, string> = {
  'warm-start': 'at the warm start',
  polish: 'at the active-set polish',
  gap: 'at a FISTA iterate',
  factorization: 'by factorization',
  'iteration-limit': 'at the iteration limit',
  'numerical-failure': 'on a numerical failure',
};

const iterationWords = (n: number) => `${n} iteration${n === 1 ? '' : 's'}`;

export function describeSolve(status: SolveInfo['status'], gap: number, tolerance: number, iterations: number, stoppedBy: StopRule): string {
  if (status === 'converged') {
    return `converged ${RULE_WORDS[stoppedBy]}: relative duality gap ${gap.toExponential(2)} <= ${tolerance} after ${iterationWords(iterations)}`;
  }
  if (status === 'iteration-limit') {
    return `stopped at the iteration limit (${iterations}) with relative duality gap ${gap.toExponential(2)} > tolerance ${tolerance}`;
  }
  return `numerical failure (non-finite values) after ${iterationWords(iterations)}`;
}

/**
 * Gap Safe screening at the warm start. The dual is gamma-strongly concave in theta (the -n/2
 * ||theta||^2 of the gaussian dual, the entropy of the binomial one; the penalty's conjugate is
 * convex, with or without its ridge part), so D(theta) <= D(theta*) - gamma/2 ||theta - theta*||^2
 * <= P(b) - gamma/2 ||theta - theta*||^2: the optimum theta* lies within r = sqrt(2 gap / gamma) of
 * any dual point theta. A block with ||X_u'theta|| + r ||X_u||_F < lambda alpha w_u then has
 * ||X_u'theta*|| < lambda alpha w_u, which the optimality condition allows only with b_u = 0: the
 * ridge part of the elastic net has zero gradient at 0, so its subdifferential there is the lasso's
 * (Ndiaye et al. 2017, JMLR 18, sections 2-3). Where the check left a bound on |x_j'theta_raw|
 * instead of the product, the bound serves (the gaussian dual point is tau theta_raw, tau <= 1).
 * Sets keep[u] = 1 for the blocks it cannot discard, zeroes the coefficients of the others.
 */
export function gapSafe(problem: Problem, dual: DualContext, state: PathState, allBlocks: Int32Array, lambda: number, keep: Uint8Array): void {
  const pen = problem.penalty;
  const kkt = state.kkt;
  const check = checkFull(problem, dual, allBlocks, pen.start, state.coef, state.intercept, lambda, kkt, undefined, imageOf(state));
  keepImage(state, check);
  const radius = Math.sqrt((2 * Math.max(0, check.absoluteGap)) / problem.loss.dualConcavity);
  for (let u = 0; u < pen.nBlocks; u++) {
    if (pen.weight[u] === 0) {
      keep[u] = 1;
      continue;
    }
    let frob = 0;
    let sq = 0;
    for (let i = pen.start[u]; i < pen.start[u + 1]; i++) {
      const j = pen.features[i];
      frob += problem.colNormSq[j];
      const a = kkt && !kkt.exact[j] ? kkt.bound[j] : check.dual.a[j];
      sq += a * a;
    }
    const bound = Math.sqrt(sq) + radius * Math.sqrt(frob);
    keep[u] = !Number.isFinite(bound) || bound >= lambda * pen.alpha * pen.weight[u] ? 1 : 0;
    if (!keep[u]) for (let i = pen.start[u]; i < pen.start[u + 1]; i++) state.coef[pen.features[i]] = 0;
  }
}

function solveRestricted(
  problem: Problem,
  dual: DualContext,
  ws: WorkingSet,
  state: PathState,
  lambda: number,
  options: { polish: boolean; tolerance: number; maxIterations: number },
) {
  const pen = problem.penalty;
  const loss = problem.loss.bind(ws);
  const w = new Float64Array(ws.size);
  for (let b = 0; b < ws.k; b++) w[b] = state.coef[ws.features[b]];
  if (ws.size > ws.k) w[ws.k] = state.intercept;
  // X'theta on the working set, column-indexed for the dual (which reads only those columns).
  state.scratch ??= new Float64Array(problem.p);
  const g = state.scratch;
  const grad = new Float64Array(ws.size);
  // The point of the last gap evaluation: when the solve ends there, g holds the working set's
  // x_j'theta at the solution, which the full check then need not compute again.
  const evaluated = new Float64Array(ws.size).fill(NaN);
  const image = imageOf(state);
  // At an unmoved warm start the last check's x_j'theta are the working set's (exact on every
  // working column: the strong rule made them so): FISTA's first gap needs no products.
  let warm = image && state.kkt?.exactOn(state.g, ws.features) ? state.g : null;
  // Those products belong to the warm start only: a solve that polishes first (LossRole.polishFirst)
  // may compute its first gap elsewhere.
  const start = warm ? Float64Array.from(w) : null;
  const positions = new Int32Array(ws.k);
  const gap = (v: Float64Array, img: Float64Array, known?: KnownGradient): number => {
    evaluated.set(v);
    const value = loss.value(img, v);
    const residual = loss.residual(img, v);
    if (warm && start && sameValues(v, start)) {
      for (let b = 0; b < ws.k; b++) g[ws.features[b]] = warm[ws.features[b]];
      warm = null;
    } else if (known && loss.gradientOn) {
      // The polish left x_b'theta off its support: the products on the support remain.
      let count = 0;
      for (let b = 0; b < ws.k; b++) if (!known.known[b]) positions[count++] = b;
      loss.gradientOn(img, v, grad, positions, count);
      for (let b = 0; b < ws.k; b++) g[ws.features[b]] = known.known[b] ? known.values[b] : -grad[b];
    } else {
      loss.gradient(img, v, grad);
      for (let b = 0; b < ws.k; b++) g[ws.features[b]] = -grad[b];
    }
    const penalty = penaltyValue(pen, ws.blocks, ws.blockStart, v, lambda);
    const result = dual.gap({ lambda, blocks: ws.blocks, g, loss: value, penalty, residual });
    return result.gap / problem.nullObjective;
  };
  if (state.lipschitz <= 0) state.lipschitz = loss.lipschitz();
  const estimate = state.lipschitz;
  const outcome = fista(
    {
      size: ws.size,
      loss,
      prox: (z, out, step) => penaltyProx(pen, ws.blocks, ws.blockStart, z, out, step * lambda),
      gap,
      polish:
        options.polish && singleColumnBlocks(ws)
          ? (v, out, maxSteps) => {
              const result = polishOnSupport(problem, ws, lambda, v, out, maxSteps, state.support, options.tolerance);
              const last = state.support.last;
              state.support.last = undefined;
              // One literal shape for every outcome (see the return of solveRestricted).
              const outcome: PolishOutcome = { ok: result.ok, steps: result.steps, image: undefined, gradient: undefined };
              if (!result.ok || !last || last.w.length !== ws.k) return outcome;
              for (let b = 0; b < ws.k; b++) if (last.w[b] !== out[b]) return outcome;
              outcome.image = last.image;
              outcome.gradient = last;
              return outcome;
            }
          : undefined,
    },
    w,
    {
      tolerance: options.tolerance,
      maxIterations: options.maxIterations,
      checkEvery: CHECK_EVERY,
      lipschitz: estimate > 0 ? estimate : 1,
      image,
      // Not from the null model (the path's first lambdas): there the warm start usually is the
      // answer, and keeping it keeps the CV's scores at lambda_max those of exactly zero coefficients.
      polishFirst: problem.loss.polishFirst === true && hasNonZero(w, ws.k),
    },
  );
  state.lipschitz = outcome.lipschitz;
  for (let b = 0; b < ws.k; b++) state.coef[ws.features[b]] = w[b];
  if (ws.size > ws.k) state.intercept = w[ws.k];
  let atSolution = true;
  for (let b = 0; b < ws.size && atSolution; b++) atSolution = w[b] === evaluated[b];
  const known: KnownProducts | undefined = atSolution ? { features: ws.features, count: ws.k, values: g } : undefined;
  // A literal with the fields named, not a spread of fista's outcome: a spread's copies left
  // solveAtLambda's optimized code facing new object maps fold after fold ("wrong map"
  // deoptimizations, ~10 per wide 300x1500 CV run, each followed by a recompilation).
  return { status: outcome.status, stoppedBy: outcome.stoppedBy, iterations: outcome.iterations, image: outcome.image, known };
}

function keptBlocks(keep: Uint8Array): Int32Array {
  let count = 0;
  for (let u = 0; u < keep.length; u++) count += keep[u];
  const blocks = new Int32Array(count);
  let at = 0;
  for (let u = 0; u < keep.length; u++) if (keep[u]) blocks[at++] = u;
  return blocks;
}

/** Keeps the check's image of X b with the coefficients it belongs to (design forms that give one). */
function keepImage(state: PathState, check: FullCheck): void {
  if (!check.image) {
    state.image = undefined;
    return;
  }
  if (state.image && state.image.coef.length === state.coef.length && state.image.eta.length === check.image.length) {
    state.image.eta.set(check.image);
    state.image.coef.set(state.coef);
  } else state.image = { eta: Float64Array.from(check.image), coef: Float64Array.from(state.coef) };
}

/** The kept image when the coefficients have not moved since it was computed. */
function imageOf(state: PathState): Float64Array | undefined {
  const kept = state.image;
  if (!kept || kept.coef.length !== state.coef.length) return undefined;
  for (let j = 0; j < state.coef.length; j++) if (kept.coef[j] !== state.coef[j]) return undefined;
  return kept.eta;
}

/** The active-set polish handles lasso and elastic-net blocks (one column each). */
function singleColumnBlocks(ws: WorkingSet): boolean {
  return ws.blocks.length === ws.k;
}

function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

function hasNonZero(w: Float64Array, k: number): boolean {
  for (let b = 0; b < k; b++) if (w[b] !== 0) return true;
  return false;
}
