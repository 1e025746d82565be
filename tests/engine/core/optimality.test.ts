/**
 * Optimality at every reported solution (common practice): the KKT residual (distance of -gradient
 * to lambda times the penalty's subdifferential, computed independently in kkt.ts) is small, every
 * solve reports status 'converged' with its duality gap <= tolerance, the gaussian lasso gap matches
 * one computed from scratch, and the three screening choices give the same solutions.
 */
import { describe, expect, it } from 'vitest';
import { fitPathOnDesign } from '../../../server/engine/index';
import type { DesignMatrix, PathOptions, PathResult, Screening } from '../../../server/engine/types';
import { linearResponse, logisticResponse, randomDesign } from './data';
import { expectClose } from '../../support/numbers';
import { gaussianLassoGap, kktResidual, type KktSetup } from './kkt';

/** Unequal column scales and offsets, so standardization matters. */
function scaledDesign(n: number, p: number, seed: number): DesignMatrix {
  const d = randomDesign(n, p, seed);
  for (let j = 0; j < p; j++) for (let i = 0; i < n; i++) d.x[j * n + i] = d.x[j * n + i] * (1 + j / 3) + j;
  return d;
}

const truth = [1, -0.7, 0.5, 0, 0, 0.3, 0, 0, 0, -0.2];
const cases: { name: string; design: DesignMatrix; y: Float64Array; family: 'gaussian' | 'binomial' }[] = [
  (() => {
    const design = scaledDesign(80, 30, 21);
    return { name: 'gaussian n>p', design, y: linearResponse(design, truth, 1, 22), family: 'gaussian' as const };
  })(),
  (() => {
    const design = scaledDesign(40, 90, 23);
    return { name: 'gaussian p>n', design, y: linearResponse(design, truth, 0.5, 24), family: 'gaussian' as const };
  })(),
  (() => {
    const design = scaledDesign(150, 20, 25);
    return { name: 'binomial n>p', design, y: logisticResponse(design, truth, 26), family: 'binomial' as const };
  })(),
  (() => {
    const design = scaledDesign(60, 100, 27);
    return { name: 'binomial p>n', design, y: logisticResponse(design, truth, 28), family: 'binomial' as const };
  })(),
];

const tolerance = 1e-9;

function singletons(p: number, weight = 1): KktSetup['blocks'] {
  return Array.from({ length: p }, (_, j) => ({ columns: [j], weight }));
}

function checkPath(result: PathResult, design: DesignMatrix, y: Float64Array, setup: KktSetup, label: string): void {
  result.solves.forEach((solve, k) => {
    expect(solve.status, `${label} lambda ${result.lambda[k]}: ${solve.message}`).toBe('converged');
    expect(solve.gap, `${label}: reported gap at lambda ${result.lambda[k]}`).toBeLessThanOrEqual(tolerance);
    const kkt = kktResidual(design, y, result, k, setup);
    // A relative gap eps bounds the KKT residual by about sqrt(2 L eps nullObjective); 1e-4 is ample.
    expect(kkt, `${label}: KKT residual at lambda ${result.lambda[k]} (tolerance 1e-4)`).toBeLessThanOrEqual(1e-4);
  });
}

describe('KKT and duality gap at every solution', () => {
  for (const c of cases) {
    for (const standardize of [true, false]) {
      for (const penalty of ['lasso', 'elastic-net'] as const) {
        it(`${c.name}, ${penalty}, standardize ${standardize}`, () => {
          const alpha = penalty === 'lasso' ? 1 : 0.6;
          const options: PathOptions = { family: c.family, penalty, ...(penalty === 'elastic-net' ? { l1Share: alpha } : {}), standardize, pathLength: 25, tolerance };
          const result = fitPathOnDesign(c.design, c.y, options);
          checkPath(result, c.design, c.y, { family: c.family, alpha, standardize, blocks: singletons(c.design.p) }, c.name);
          if (c.family === 'gaussian' && penalty === 'lasso') {
            result.lambda.forEach((lambda, k) => {
              const scratch = gaussianLassoGap(c.design, c.y, result, k, standardize);
              expectClose(`${c.name}: reported vs recomputed relative gap at lambda ${lambda}`, result.solves[k].gap, scratch, 1e-6);
            });
          }
        });
      }
    }
    it(`${c.name}, group lasso`, () => {
      const p = c.design.p;
      const groupOfTerm = Array.from({ length: p }, (_, j) => Math.floor(j / 3));
      const result = fitPathOnDesign(c.design, c.y, { family: c.family, penalty: 'group-lasso', groupOfTerm, standardize: true, pathLength: 20, tolerance });
      const groups = new Map<number, number[]>();
      groupOfTerm.forEach((g, j) => groups.set(g, [...(groups.get(g) ?? []), j]));
      const blocks = [...groups.values()].map((columns) => ({ columns, weight: Math.sqrt(columns.length) }));
      checkPath(result, c.design, c.y, { family: c.family, alpha: 1, standardize: true, blocks }, `${c.name} group`);
    });
  }
});

describe('screening does not change the solutions', () => {
  const penalties: [string, Pick<PathOptions, 'penalty' | 'l1Share'>][] = [
    ['lasso', { penalty: 'lasso' }],
    ['group lasso', { penalty: 'group-lasso' }],
    ['elastic net', { penalty: 'elastic-net', l1Share: 0.5 }],
  ];
  for (const c of cases) for (const [penaltyName, penalty] of penalties) {
    it(`${c.name}, ${penaltyName}`, () => {
      const groupOfTerm = Array.from({ length: c.design.p }, (_, j) => Math.floor(j / 2));
      const fits = (['strong', 'gap-safe', 'none'] as Screening[]).map((screening) =>
        fitPathOnDesign(c.design, c.y, { family: c.family, ...penalty, groupOfTerm, standardize: true, pathLength: 20, tolerance: 1e-11, screening }),
      );
      for (const other of fits.slice(1)) {
        other.lambda.forEach((lambda, k) => {
          for (let j = 0; j < c.design.p; j++) {
            expectClose(`${c.name} coefficient ${j} at lambda ${lambda}`, other.standardizedCoefficients[k][j], fits[0].standardizedCoefficients[k][j], 1e-4);
          }
          expectClose(`${c.name} intercept at lambda ${lambda}`, other.intercept[k], fits[0].intercept[k], 1e-4);
        });
      }
    });
  }
});

describe('KKT and duality gap with penalty weights (0 = unpenalized)', () => {
  for (const c of cases) {
    for (const screening of ['strong', 'gap-safe'] as Screening[]) {
      it(`${c.name}, ${screening}`, () => {
        const p = c.design.p;
        const factors = Array.from({ length: p }, (_, j) => (j === 1 ? 0 : j % 4 === 0 ? 2 : j % 5 === 0 ? 0.5 : 1));
        const result = fitPathOnDesign(c.design, c.y, { family: c.family, penalty: 'lasso', standardize: true, penaltyWeights: factors, pathLength: 20, tolerance, screening });
        const blocks = factors.map((weight, j) => ({ columns: [j], weight }));
        checkPath(result, c.design, c.y, { family: c.family, alpha: 1, standardize: true, blocks }, `${c.name} factors`);
        result.coefficients.forEach((coef) => expect(coef[1]).not.toBe(0));
      });
    }
  }
});
