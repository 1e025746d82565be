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

describe('deviance ratio and the optional early stop', () => {
  it('deviance ratio = 1 - RSS/TSS (gaussian, common practice), recomputed from the coefficients', () => {
    const result = fitPathOnDesign(design, y, { family: 'gaussian', penalty: 'lasso', alpha: 1, standardize: true, pathLength: 8, tolerance: 1e-10 });
    const { n, p, x } = design;
    const mean = y.reduce((a, b) => a + b, 0) / n;
    const tss = y.reduce((a, b) => a + (b - mean) ** 2, 0);
    result.lambda.forEach((lambda, k) => {
      let rss = 0;
      for (let i = 0; i < n; i++) {
        let e = result.intercept[k];
        for (let j = 0; j < p; j++) e += result.coefficients[k][j] * x[j * n + i];
        rss += (y[i] - e) ** 2;
      }
      expect(Math.abs(result.devianceRatio[k] - (1 - rss / tss)), `deviance ratio at lambda ${lambda}`).toBeLessThan(1e-9);
    });
  });

  it('stops once the deviance ratio exceeds 0.999 or changes by < 1e-5 (relative), and says so', () => {
    const options: PathOptions = { family: 'gaussian', penalty: 'lasso', alpha: 1, standardize: true, pathLength: 100, lambdaRatio: 1e-4 };
    const full = fitPathOnDesign(design, y, options);
    const early = fitPathOnDesign(design, y, { ...options, earlyStop: true });
    expect(full.lambda.length).toBe(100);
    expect(early.lambda.length).toBeLessThan(100);
    const k = early.lambda.length - 1;
    const last = early.devianceRatio[k];
    expect(last > 0.999 || Math.abs(last - early.devianceRatio[k - 1]) < 1e-5 * Math.abs(last)).toBe(true);
    expect(early.notes.join('\n')).toContain('stopped early');
  });
});
