/**
 * Closed forms on orthonormal designs (common practice): with centred
 * columns and X'X/n = I, z = X'(y - mean y)/n,
 *   lasso:        b_j = sign(z_j)(|z_j| - lambda)_+
 *   elastic net:  b_j = sign(z_j)(|z_j| - lambda alpha)_+ / (1 + lambda (1 - alpha))
 *   group lasso:  b_g = (1 - lambda w_g / ||z_g||)_+ z_g, w_g = sqrt(|g|)
 * and the intercept is mean(y) (centred columns).
 */
import { describe, it } from 'vitest';
import { fitPathOnDesign } from '../../../server/engine/index';
import { linearResponse, orthonormalDesign } from './data';
import { expectClose } from '../../support/numbers';

const n = 120;
const p = 8;
const design = orthonormalDesign(n, p, 11);
const y = linearResponse(design, [1.5, -0.8, 0.4, 0.2, 0, 0, -0.1, 0.05], 0.5, 12);
const yMean = y.reduce((a, v) => a + v, 0) / n;
const z = Array.from({ length: p }, (_, j) => {
  let s = 0;
  for (let i = 0; i < n; i++) s += design.x[j * n + i] * (y[i] - yMean);
  return s / n;
});
const soft = (v: number, t: number) => Math.sign(v) * Math.max(Math.abs(v) - t, 0);
const tol = 1e-6;

describe('orthonormal design closed forms', () => {
  for (const standardize of [true, false]) {
    it(`lasso: b_j = sign(z_j)(|z_j| - lambda)_+ (standardize ${standardize})`, () => {
      const result = fitPathOnDesign(design, y, { family: 'gaussian', penalty: 'lasso', standardize, pathLength: 15, tolerance: 1e-12 });
      result.lambda.forEach((lambda, k) => {
        for (let j = 0; j < p; j++) {
          expectClose(`lasso b_${j} at lambda ${lambda}`, result.coefficients[k][j], soft(z[j], lambda), tol);
        }
        expectClose(`intercept at lambda ${lambda}`, result.intercept[k], yMean, tol);
      });
    });
  }

  it('elastic net: b_j = S(z_j, lambda alpha) / (1 + lambda (1 - alpha))', () => {
    const alpha = 0.4;
    const result = fitPathOnDesign(design, y, { family: 'gaussian', penalty: 'elastic-net', l1Share: alpha, standardize: true, pathLength: 12, tolerance: 1e-12 });
    result.lambda.forEach((lambda, k) => {
      for (let j = 0; j < p; j++) {
        const expected = soft(z[j], lambda * alpha) / (1 + lambda * (1 - alpha));
        expectClose(`elastic net b_${j} at lambda ${lambda}`, result.coefficients[k][j], expected, tol);
      }
    });
  });

  it('group lasso: b_g = (1 - lambda sqrt(|g|) / ||z_g||)_+ z_g', () => {
    const groupOfTerm = [0, 0, 0, 1, 1, 2, 3, 3];
    const result = fitPathOnDesign(design, y, {
      family: 'gaussian',
      penalty: 'group-lasso',
      groupOfTerm,
      standardize: true,
      pathLength: 12,
      tolerance: 1e-12,
    });
    const groups = [0, 1, 2, 3].map((g) => groupOfTerm.flatMap((h, j) => (h === g ? [j] : [])));
    result.lambda.forEach((lambda, k) => {
      for (const members of groups) {
        const norm = Math.sqrt(members.reduce((a, j) => a + z[j] ** 2, 0));
        const shrink = Math.max(0, 1 - (lambda * Math.sqrt(members.length)) / norm);
        for (const j of members) expectClose(`group lasso b_${j} at lambda ${lambda}`, result.coefficients[k][j], shrink * z[j], tol);
      }
    });
  });
});
