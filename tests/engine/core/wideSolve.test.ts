/**
 * The wide-data (design form) solver's shortcuts must not change what a solve certifies:
 * - the full check with KKT bounds (path/check.ts KktBounds) skips only columns whose |x_j'theta| is
 *   provably below lambda alpha w_j, so its duality gap and KKT decisions equal a full product's;
 * - Gap Safe screening (solveAtLambda.ts gapSafe, Ndiaye et al. 2017, JMLR 18) discards only blocks
 *   that are zero at the optimum, for the elastic net as for the lasso;
 * - the support system's G cache returns a column's entries when it rejoins the support, and any
 *   history of joins, leaves and evictions solves as a fresh factorization does.
 */
import { describe, expect, it } from 'vitest';
import { SupportSystem } from '../../../server/engine/core/supportSystem';
import { fitPathOnDesign } from '../../../server/engine/index';
import { checkFull, KktBounds } from '../../../server/engine/path/check';
import { prepareProblem } from '../../../server/engine/path/setup';
import { gapSafe, newPathState, solveAtLambda, type PathState } from '../../../server/engine/path/solveAtLambda';
import type { PathOptions } from '../../../server/engine/types';
import { createRng } from '../../../server/engine/random';
import { expectClose } from '../../support/numbers';
import { linearResponse, randomDesign } from './data';

const n = 40;
const p = 160;
const design = randomDesign(n, p, 11);
const y = linearResponse(design, [3, -2, 1.5, 0, 0, 1, -1, 0.5], 0.5, 12);

function options(alpha: number): PathOptions {
  return alpha < 1
    ? { family: 'gaussian', penalty: 'elastic-net', l1Share: alpha, standardize: true, tolerance: 1e-12, pathLength: 30, gram: 'never' }
    : { family: 'gaussian', penalty: 'lasso', standardize: true, tolerance: 1e-12, pathLength: 30, gram: 'never' };
}

describe.each([1, 0.4])('wide solve shortcuts, L1 share %s', (alpha) => {
  const path = fitPathOnDesign(design, y, options(alpha));
  const prepared = prepareProblem(design, y, options(alpha));
  const { problem, dual } = prepared;
  const pen = problem.penalty;
  const allBlocks = Int32Array.from({ length: pen.nBlocks }, (_, u) => u);

  it('the check with KKT bounds gives the full check\'s gap and KKT decisions, and skips columns', () => {
    const bounds = new KktBounds(problem);
    let skipped = 0;
    path.lambda.forEach((lambda, k) => {
      const coef = Float64Array.from(path.standardizedCoefficients[k]);
      const full = checkFull(problem, dual, allBlocks, pen.start, coef, 0, lambda);
      const fullGap = full.gap;
      const fullG = Float64Array.from(full.g);
      const bounded = checkFull(problem, dual, allBlocks, pen.start, coef, 0, lambda, bounds);
      expect(bounded.gap, `lambda ${lambda}: relative gap with bounds`).toBe(fullGap);
      for (let j = 0; j < p; j++) {
        const limit = lambda * pen.alpha * pen.weight[j];
        if (bounds.exact[j]) {
          expect(bounded.g[j], `lambda ${lambda} column ${j}: computed product`).toBe(fullG[j]);
        } else {
          skipped++;
          expect(Math.abs(fullG[j]) <= bounds.bound[j], `lambda ${lambda} column ${j}: |x'theta| ${Math.abs(fullG[j])} within its bound ${bounds.bound[j]}`).toBe(true);
          expect(bounds.bound[j] < limit, `lambda ${lambda} column ${j}: a skipped column's bound is below lambda alpha w`).toBe(true);
        }
      }
    });
    // Past the first lambda most columns sit well inside their KKT bound: the bounds must spare products.
    expect(skipped, 'columns the bounds spared over the path').toBeGreaterThan((path.lambda.length * p) / 4);
  });

  it('Gap Safe keeps every block that is non-zero at the optimum and discards many zero ones', () => {
    let discarded = 0;
    let zero = 0;
    for (let k = 1; k < path.lambda.length; k++) {
      const lambda = path.lambda[k];
      // Warm start: the solution at the previous lambda (as along a path).
      const state: PathState = {
        coef: Float64Array.from(path.standardizedCoefficients[k - 1]),
        intercept: 0,
        g: new Float64Array(p),
        loss: 0,
        lipschitz: 0,
        support: {},
      };
      const keep = new Uint8Array(pen.nBlocks);
      gapSafe(problem, dual, state, allBlocks, lambda, keep);
      const optimum = path.standardizedCoefficients[k];
      for (let j = 0; j < p; j++) {
        if (optimum[j] !== 0) expect(keep[j], `lambda ${lambda}: column ${j} is non-zero at the optimum (${optimum[j]})`).toBe(1);
        else {
          zero++;
          if (!keep[j]) discarded++;
        }
      }
    }
    expect(discarded, `zero blocks discarded (of ${zero})`).toBeGreaterThan(zero / 10);
  });

  it('a path with Gap Safe screening equals the strong-rule path', () => {
    const safe = fitPathOnDesign(design, y, { ...options(alpha), screening: 'gap-safe' });
    path.lambda.forEach((lambda, k) => {
      for (let j = 0; j < p; j++) {
        expectClose(`lambda ${lambda} column ${j}`, safe.standardizedCoefficients[k][j], path.standardizedCoefficients[k][j], 1e-5);
      }
    });
  });
});

describe('SupportSystem G cache', () => {
  const m = 30;
  const rows = 50;
  const rng = createRng(5);
  const x = Array.from({ length: m }, () => Array.from({ length: rows }, () => rng.normal()));
  let calls = 0;
  const entry = (f: number, g: number): number => {
    calls++;
    return x[f].reduce((s, v, i) => s + v * x[g][i], 0) / rows;
  };

  function solve(system: SupportSystem, features: number[]): Float64Array {
    const out = new Float64Array(features.length);
    const rhs = Float64Array.from(features, (f) => Math.sin(f + 1));
    expect(system.solve(features, features.map(() => 0), rhs, out)).toBe(true);
    return out;
  }

  it('a column that leaves and rejoins finds its entries with the columns that stayed', () => {
    const system = new SupportSystem(entry);
    calls = 0;
    solve(system, [0, 1, 2, 3, 4, 5]);
    expect(calls, 'entries of a 6-column support').toBe(21);
    solve(system, [0, 1, 2, 4, 5]);
    solve(system, [0, 1, 2, 4, 5, 3]);
    expect(calls, 'entries after column 3 left and rejoined').toBe(21);
  });

  it('through joins, leaves and evictions, every solve equals a fresh factorization', () => {
    const system = new SupportSystem(entry);
    // A support of 4 to 8 columns wandering over 30: the cache (1.5 times the support) must evict.
    for (let step = 0; step < 40; step++) {
      const size = 4 + (step % 5);
      const features = Array.from({ length: size }, (_, q) => (3 * step + 7 * q) % m).filter((f, q, all) => all.indexOf(f) === q);
      const got = solve(system, features);
      const fresh = solve(new SupportSystem(entry), features);
      features.forEach((f, q) => expectClose(`step ${step} support [${features}] column ${f}`, got[q], fresh[q], 1e-10));
    }
  });
});

describe('path state carried between lambdas', () => {
  const opts = options(1);
  const path = fitPathOnDesign(design, y, opts);
  const { problem, dual } = prepareProblem(design, y, opts);

  function freshState(coef: Float64Array): PathState {
    return { coef: Float64Array.from(coef), intercept: 0, g: new Float64Array(p), loss: 0, lipschitz: 0, support: {} };
  }

  it('solves along a path add no field to a new path state (one object shape for every fold)', () => {
    const shape = (state: PathState) => [...Object.keys(state), ...Object.keys(state.support).map((k) => `support.${k}`)].sort().join(',');
    const state = newPathState(Float64Array.from(path.standardizedCoefficients[2]), 0, new Float64Array(p), 0);
    const before = shape(state);
    for (let k = 3; k < 12; k++) {
      const info = solveAtLambda(problem, dual, state, { lambda: path.lambda[k], previousLambda: path.lambda[k - 1], tolerance: 1e-10, maxIterations: 10000, screening: 'strong', polish: true });
      expect(info.status).toBe('converged');
    }
    // The solves did fill the lazy fields (else the check would prove nothing)...
    expect(state.kkt).toBeDefined();
    expect(state.support.system).toBeDefined();
    // ...without adding any.
    expect(shape(state)).toBe(before);
  });

  it('a solve after the coefficients were moved from outside (a warm start) equals one from a fresh state', () => {
    const lambdaOptions = (k: number) => ({ lambda: path.lambda[k], previousLambda: path.lambda[k - 1], tolerance: 1e-10, maxIterations: 10000, screening: 'strong' as const, polish: true });
    // A state that has solved lambda 5 (its image, bounds and factor belong to that solution)...
    const carried = freshState(path.standardizedCoefficients[4]);
    solveAtLambda(problem, dual, carried, lambdaOptions(5));
    // ...then is warm-started elsewhere, as a cross-validation fold from the full-data path.
    carried.coef.set(path.standardizedCoefficients[20]);
    carried.g = new Float64Array(p);
    const fresh = freshState(path.standardizedCoefficients[20]);
    const a = solveAtLambda(problem, dual, carried, lambdaOptions(20));
    const b = solveAtLambda(problem, dual, fresh, lambdaOptions(20));
    // The path's own solution meets the tolerance where it stands: both must see that.
    expect(b.stoppedBy).toBe('warm-start');
    expect(a.stoppedBy, 'how the moved state stopped').toBe(b.stoppedBy);
    expect(a.iterations).toBe(b.iterations);
    expectClose('relative gap', a.gap, b.gap, 1e-12);
    for (let j = 0; j < p; j++) expectClose(`column ${j}`, carried.coef[j], fresh.coef[j], 1e-9);
  });
});
