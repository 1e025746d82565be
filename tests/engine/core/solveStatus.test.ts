/**
 * Never a silent non-convergence (DESIGN.md, STYLE.md 9): a tiny iteration limit gives status
 * 'iteration-limit' with the gap above the tolerance reported; and the same input gives
 * bitwise-identical output (determinism; no randomness or timing in the numbers).
 */
import { describe, expect, it } from 'vitest';
import { fitPathOnDesign } from '../../../server/engine/index';
import type { PathOptions, PathResult } from '../../../server/engine/types';
import { linearResponse, logisticResponse, randomDesign } from './data';

const design = randomDesign(60, 120, 51);
const y = linearResponse(design, [1, -1, 0.5, 0.5], 0.5, 52);
const yBin = logisticResponse(design, [1, -1, 0.5, 0.5], 53);

describe('iteration limit', () => {
  for (const [family, response] of [['gaussian', y], ['binomial', yBin]] as const) {
    it(`${family}: reports 'iteration-limit' with gap > tolerance`, () => {
      const result = fitPathOnDesign(design, response, { family, penalty: 'lasso', alpha: 1, standardize: true, pathLength: 10, tolerance: 1e-12, maxIterations: 3 });
      const limited = result.solves.filter((s) => s.status === 'iteration-limit');
      expect(limited.length).toBeGreaterThan(0);
      for (const s of limited) {
        expect(s.gap).toBeGreaterThan(s.tolerance);
        expect(s.tolerance).toBe(1e-12);
        expect(s.iterations).toBeLessThanOrEqual(3);
        expect(s.message).toContain('iteration limit');
      }
      for (const coef of result.coefficients) for (const b of coef) expect(Number.isFinite(b)).toBe(true);
    });
  }
});

function bytes(result: PathResult): string {
  const parts: number[] = [...result.lambda, ...result.intercept, ...result.solves.map((s) => s.gap), ...result.solves.map((s) => s.iterations)];
  for (const c of result.coefficients) parts.push(...c);
  return Buffer.from(Float64Array.from(parts).buffer).toString('hex');
}

describe('determinism', () => {
  const runs: [string, PathOptions, Float64Array][] = [
    ['gaussian strong', { family: 'gaussian', penalty: 'lasso', alpha: 1, standardize: true, pathLength: 30 }, y],
    ['binomial gap-safe', { family: 'binomial', penalty: 'lasso', alpha: 1, standardize: true, pathLength: 30, screening: 'gap-safe' }, yBin],
    ['gaussian group', { family: 'gaussian', penalty: 'group-lasso', alpha: 1, standardize: false, pathLength: 30, groupOfTerm: Array.from({ length: 120 }, (_, j) => j >> 2) }, y],
  ];
  for (const [name, options, response] of runs) {
    it(`${name}: two runs are bitwise identical`, () => {
      expect(bytes(fitPathOnDesign(design, response, options))).toBe(bytes(fitPathOnDesign(design, response, options)));
    });
  }
});
