/**
 * The Gram form built from cross products alone (CV folds: S(all) - S(held out)) solves the same
 * problem as the one built from the rows: same lambda_max, coefficients within what the tolerance
 * allows, same constant columns. And every solve says which point met the tolerance.
 */
import { describe, expect, it } from 'vitest';
import {
  constantColumns,
  crossProducts,
  fitPathOnCrossProducts,
  fitPathOnDesign,
  selectRows,
  subtractCrossProducts,
} from '../../../server/engine';
import type { DesignMatrix, PathOptions } from '../../../server/engine/types';
import { createRng } from '../../../server/engine/random';
import { expectClose } from '../../support/numbers';

const n = 400;
const p = 8;
const rng = createRng(11);
const x = new Float64Array(n * p);
for (let j = 0; j < p; j++) {
  for (let i = 0; i < n; i++) x[j * n + i] = j === 5 ? 3 : 100 * j + 10 ** (j % 3) * rng.normal();
}
const y = Float64Array.from({ length: n }, (_, i) => 5 + x[i] - 0.02 * x[2 * n + i] + rng.normal());
const design: DesignMatrix = { n, p, x, terms: Array.from({ length: p }, (_, j) => `x${j}`) };
const foldIds = Int32Array.from({ length: n }, (_, i) => i % 4);

describe('paths from cross products', () => {
  for (const standardize of [true, false]) {
    it(`match the path from the rows (fold 2's training rows, standardize ${standardize})`, () => {
      const options: PathOptions = { family: 'gaussian', penalty: 'lasso', standardize, pathLength: 20, tolerance: 1e-12, gram: 'always' };
      const train = Array.from({ length: n }, (_, i) => i).filter((i) => foldIds[i] !== 2);
      const rows = selectRows(design, y, train);
      const fromRows = fitPathOnDesign(rows.design, rows.y, options);
      const all = crossProducts(design, undefined, undefined, y);
      const test = Array.from({ length: n }, (_, i) => i).filter((i) => foldIds[i] === 2);
      const cp = subtractCrossProducts(all, crossProducts(design, test, all.center, y, all.response?.center));
      const fromSums = fitPathOnCrossProducts(design.terms, cp, constantColumns(design, train), { ...options, lambda: fromRows.lambda });
      expectClose('lambda_max', fromSums.lambdaMax, fromRows.lambdaMax, 1e-10);
      fromRows.lambda.forEach((lambda, k) => {
        expectClose(`intercept at lambda ${lambda}`, fromSums.intercept[k], fromRows.intercept[k], 1e-7);
        for (let j = 0; j < p; j++) expectClose(`b_${j} at lambda ${lambda}`, fromSums.coefficients[k][j], fromRows.coefficients[k][j], 1e-7);
      });
      expect(fromSums.notes.some((note) => note.includes('"x5" is constant'))).toBe(true);
    });
  }

  it('refuse lambda = 0 (the exact unpenalized fit needs the rows)', () => {
    const cp = crossProducts(design, undefined, undefined, y);
    expect(() => fitPathOnCrossProducts(design.terms, cp, constantColumns(design), { family: 'gaussian', penalty: 'lasso', standardize: true, lambda: [1, 0] })).toThrow(/lambda = 0/);
  });

  it('say which point met the tolerance, and every converged gap is within it', () => {
    const tolerance = 1e-4;
    const result = fitPathOnDesign(design, y, { family: 'gaussian', penalty: 'lasso', standardize: true, pathLength: 30, tolerance });
    for (const solve of result.solves) {
      expect(solve.status).toBe('converged');
      expect(['warm-start', 'polish', 'gap']).toContain(solve.stoppedBy);
      expect(solve.gap).toBeLessThanOrEqual(tolerance);
      expect(solve.message).toMatch(/converged at (the warm start|the active-set polish|a FISTA iterate)/);
    }
  });
});
