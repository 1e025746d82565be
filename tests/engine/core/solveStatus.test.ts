/**
 * Never a silent non-convergence (docs/engine.md, "Solving and the stopping rule"): a tiny iteration limit gives status
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
      const result = fitPathOnDesign(design, response, { family, penalty: 'lasso', standardize: true, pathLength: 10, tolerance: 1e-12, maxIterations: 3 });
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
    ['gaussian strong', { family: 'gaussian', penalty: 'lasso', standardize: true, pathLength: 30 }, y],
    ['binomial gap-safe', { family: 'binomial', penalty: 'lasso', standardize: true, pathLength: 30, screening: 'gap-safe' }, yBin],
    ['gaussian group', { family: 'gaussian', penalty: 'group-lasso', standardize: false, pathLength: 30, groupOfTerm: Array.from({ length: 120 }, (_, j) => j >> 2) }, y],
  ];
  for (const [name, options, response] of runs) {
    it(`${name}: two runs are bitwise identical`, () => {
      expect(bytes(fitPathOnDesign(design, response, options))).toBe(bytes(fitPathOnDesign(design, response, options)));
    });
  }
});

describe('deviance explained and the optional early stop', () => {
  it('deviance explained = 1 - RSS/TSS (gaussian, common practice), recomputed from the coefficients', () => {
    const result = fitPathOnDesign(design, y, { family: 'gaussian', penalty: 'lasso', standardize: true, pathLength: 8, tolerance: 1e-10 });
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
      expect(Math.abs(result.devianceExplained[k] - (1 - rss / tss)), `deviance explained at lambda ${lambda}`).toBeLessThan(1e-9);
    });
  });

  it('ends the path after the first lambda whose model has more than maxTerms nonzero terms, and says so', () => {
    const options: PathOptions = { family: 'gaussian', penalty: 'lasso', standardize: true, pathLength: 60, pathDecades: 3 };
    const full = fitPathOnDesign(design, y, options);
    const limit = 5;
    const crossing = full.nonzero.findIndex((count) => count > limit);
    expect(crossing, 'the full path must pass the limit for this check to mean anything').toBeGreaterThan(0);
    const ended = fitPathOnDesign(design, y, { ...options, maxTerms: limit });
    expect(ended.lambda).toEqual(full.lambda.slice(0, crossing + 1));
    expect(ended.nonzero.slice(0, -1).every((count) => count <= limit)).toBe(true);
    expect(ended.nonzero[crossing]).toBeGreaterThan(limit);
    expect(ended.notes.join('\n')).toContain(`more than the limit of ${limit}`);
    const roomy = fitPathOnDesign(design, y, { ...options, maxTerms: design.p });
    expect(roomy.lambda.length).toBe(60);
  });
});
