/**
 * The active-set polish (server/engine/core/polish.ts): its kept-factorized support system against
 * an independent dense solver (ml-matrix's LU decomposition), and whole paths with and without it on
 * nearly collinear columns, where a duality gap alone bounds the coefficients loosely: with the
 * polish the KKT residual (computed independently in kkt.ts) must be at rounding level; both paths
 * must agree within the strong-convexity radius the gap guarantees (Boyd & Vandenberghe 2004, 9.1.2).
 */
import { Matrix, solve } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { SupportSystem } from '../../../server/engine/core/supportSystem';
import { fitPathOnDesign } from '../../../server/engine/index';
import type { DesignMatrix, PathOptions, PathResult } from '../../../server/engine/types';
import { createRng } from '../../../server/engine/random';
import { linearResponse, logisticResponse, randomDesign } from './data';
import { kktResidual } from './kkt';

/** Columns 0 and 1 nearly collinear (x1 = x0 + 1e-3 noise), the rest independent normals. */
function collinearDesign(n: number, p: number, seed: number): DesignMatrix {
  const design = randomDesign(n, p, seed);
  const rng = createRng(seed + 1);
  for (let i = 0; i < n; i++) design.x[n + i] = design.x[i] + 1e-3 * rng.normal();
  return design;
}

describe('support system (bordered Cholesky kept between calls)', () => {
  const design = collinearDesign(40, 12, 3);
  const { n, x } = design;
  const gram = (f: number, g: number): number => {
    let s = 0;
    for (let i = 0; i < n; i++) s += x[f * n + i] * x[g * n + i];
    return s / n;
  };
  const steps: [number[], number][] = [
    [[0, 3, 5], 0],
    [[0, 3, 5, 1, 7], 0],
    [[0, 5, 1, 7, 9], 0],
    [[0, 5, 1, 7, 9], 0.05],
    [[2, 0, 5, 1, 7, 9, 11, 4], 0.05],
    [[11, 4], 0.2],
  ];
  it('solves (G_AA + shift I) b = rhs like a dense LU solve, through adds, drops and shift changes', () => {
    const system = new SupportSystem(gram);
    const rng = createRng(9);
    for (const [features, shift] of steps) {
      const m = features.length;
      const rhs = Float64Array.from({ length: m }, () => rng.normal());
      const got = new Float64Array(m);
      expect(system.solve(features, features.map(() => shift), rhs, got)).toBe(true);
      const dense = new Matrix(features.map((f) => features.map((g) => gram(f, g) + (f === g ? shift : 0))));
      const expected = solve(dense, Matrix.columnVector(Array.from(rhs))).to1DArray();
      features.forEach((f, q) => {
        const bound = 1e-8 * Math.max(1, Math.abs(expected[q]));
        expect(Math.abs(got[q] - expected[q]), `support [${features}] shift ${shift} column ${f}: expected ${expected[q]}, got ${got[q]}, tolerance ${bound}`).toBeLessThanOrEqual(bound);
      });
    }
  });
});

function radiusOf(result: PathResult, k: number, alpha: number, tolerance: number): number {
  const mu = result.lambda[k] * (1 - alpha);
  return Math.sqrt((2 * tolerance * (result.nullObjective as number)) / mu);
}

describe('paths with and without the polish on nearly collinear columns', () => {
  const design = collinearDesign(80, 10, 21);
  const cases: [string, PathOptions, Float64Array][] = [
    ['gaussian elastic net', { family: 'gaussian', penalty: 'elastic-net', l1Share: 0.5, standardize: true, pathLength: 20, pathDecades: 3, tolerance: 1e-10, maxIterations: 100_000 }, linearResponse(design, [1, 1, -0.5, 0.25], 0.5, 22)],
    ['gaussian lasso, raw scale', { family: 'gaussian', penalty: 'lasso', standardize: false, pathLength: 20, pathDecades: 3, tolerance: 1e-10, maxIterations: 100_000 }, linearResponse(design, [1, 1, -0.5, 0.25], 0.5, 23)],
    ['binomial elastic net', { family: 'binomial', penalty: 'elastic-net', l1Share: 0.5, standardize: true, pathLength: 20, pathDecades: 2, tolerance: 1e-10, maxIterations: 100_000 }, logisticResponse(design, [1, 1, -0.5, 0.25], 24)],
  ];
  for (const [name, options, y] of cases) {
    it(`${name}: polished solutions satisfy KKT to 1e-9; FISTA alone agrees within the gap's radius`, () => {
      const polished = fitPathOnDesign(design, y, options);
      const plain = fitPathOnDesign(design, y, { ...options, polish: false });
      const setup = { family: options.family, alpha: options.l1Share ?? 1, standardize: options.standardize, blocks: Array.from({ length: design.p }, (_, j) => ({ columns: [j], weight: 1 })) };
      polished.lambda.forEach((lambda, k) => {
        for (const r of [polished, plain]) {
          expect(r.solves[k].status, `${name} lambda ${lambda}: ${r.solves[k].message}`).toBe('converged');
          expect(r.solves[k].gap).toBeLessThanOrEqual(options.tolerance as number);
        }
        const kkt = kktResidual(design, y, polished, k, setup);
        expect(kkt, `${name}: KKT residual of the polished solution at lambda ${lambda} (tolerance 1e-9)`).toBeLessThanOrEqual(1e-9);
        // The lasso objective is not strongly convex (no radius): compare the fits' deviance explained.
        if ((options.l1Share ?? 1) < 1) {
          const radius = 2 * radiusOf(polished, k, options.l1Share ?? 1, options.tolerance as number);
          polished.standardizedCoefficients[k].forEach((b, j) => {
            const other = plain.standardizedCoefficients[k][j];
            expect(Math.abs(b - other), `${name} lambda ${lambda} column ${j}: polished ${b}, FISTA ${other}, radius ${radius}`).toBeLessThanOrEqual(radius);
          });
        } else {
          const gapBound = 2 * (options.tolerance as number) + 1e-12;
          const excess = Math.abs(polished.devianceExplained[k] - plain.devianceExplained[k]);
          expect(excess, `${name} lambda ${lambda}: deviance explained ${polished.devianceExplained[k]} vs ${plain.devianceExplained[k]}`).toBeLessThanOrEqual(1e-4 + gapBound);
        }
      });
    });
  }

  it('the group lasso (blocks of two columns) is left to FISTA: same bits with polish on or off', () => {
    const y = linearResponse(design, [1, 1, -0.5, 0.25], 0.5, 25);
    const options: PathOptions = { family: 'gaussian', penalty: 'group-lasso', standardize: true, pathLength: 10, groupOfTerm: Array.from({ length: design.p }, (_, j) => j >> 1) };
    const a = fitPathOnDesign(design, y, options);
    const b = fitPathOnDesign(design, y, { ...options, polish: false });
    expect(a.coefficients.map((c) => Array.from(c))).toEqual(b.coefficients.map((c) => Array.from(c)));
  });
});
