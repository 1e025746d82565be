/**
 * Cross products for cross-validation folds: S(training rows) = S(all rows) - S(held-out rows)
 * about a common centre (sums over disjoint rows add; common practice), checked against the sums
 * written out here, and a gaussian path fitted from them against the same path fitted from X.
 */
import { describe, expect, it } from 'vitest';
import { crossProducts, fitPathOnDesign, selectRows, subtractCrossProducts } from '../../../server/engine/index';
import { EngineInputError, type PathOptions } from '../../../server/engine/types';
import { linearResponse, randomDesign } from './data';

const design = randomDesign(120, 8, 41);
// Large means against unit spreads: the centring must keep the sums accurate.
for (let k = 0; k < design.x.length; k++) design.x[k] += 1000 * (1 + Math.floor(k / design.n));
const y = linearResponse(design, [1, -0.5, 0, 0.25], 0.5, 42);
const heldOut = Array.from({ length: 12 }, (_, i) => i * 10 + 3);
const training = Array.from({ length: design.n }, (_, i) => i).filter((i) => !heldOut.includes(i));

describe('cross products', () => {
  it('S(all) - S(held out) equals sum over training rows of (x_i - c)(x_i - c)\' written out', () => {
    const all = crossProducts(design);
    const fold = subtractCrossProducts(all, crossProducts(design, heldOut, all.center));
    expect(fold.rows).toBe(training.length);
    const { n, p, x } = design;
    for (let j = 0; j < p; j++) {
      for (let k = 0; k < p; k++) {
        let s = 0;
        for (const i of training) s += (x[j * n + i] - all.center[j]) * (x[k * n + i] - all.center[k]);
        const bound = 1e-10 * Math.max(1, Math.abs(s));
        expect(Math.abs(fold.sums[j * p + k] - s), `S[${j}][${k}]: expected ${s}, got ${fold.sums[j * p + k]}, tolerance ${bound}`).toBeLessThanOrEqual(bound);
      }
    }
  });

  for (const standardize of [true, false]) {
    it(`a fold's path from S(all) - S(held out) matches the path from its rows (standardize ${standardize})`, () => {
      const all = crossProducts(design);
      const fold = subtractCrossProducts(all, crossProducts(design, heldOut, all.center));
      const rows = selectRows(design, y, training);
      const options: PathOptions = { family: 'gaussian', penalty: 'elastic-net', l1Share: 0.7, standardize, pathLength: 15, tolerance: 1e-10, gram: 'always' };
      const direct = fitPathOnDesign(rows.design, rows.y, options);
      const viaSums = fitPathOnDesign(rows.design, rows.y, { ...options, crossProducts: fold });
      direct.lambda.forEach((lambda, k) => {
        expect(viaSums.lambda[k]).toBe(lambda);
        expect(viaSums.solves[k].status).toBe('converged');
        direct.coefficients[k].forEach((b, j) => {
          const bound = 1e-8 * Math.max(1, Math.abs(b));
          expect(Math.abs(viaSums.coefficients[k][j] - b), `lambda ${lambda} column ${j}: expected ${b}, got ${viaSums.coefficients[k][j]}, tolerance ${bound}`).toBeLessThanOrEqual(bound);
        });
      });
    });
  }

  it('cross products of other rows are an input error naming crossProducts', () => {
    const rows = selectRows(design, y, training);
    const wrong = crossProducts(design);
    const options: PathOptions = { family: 'gaussian', penalty: 'lasso', standardize: true, pathLength: 5, gram: 'always', crossProducts: wrong };
    expect(() => fitPathOnDesign(rows.design, rows.y, options)).toThrow(EngineInputError);
    expect(() => fitPathOnDesign(rows.design, rows.y, options)).toThrow(/cross products: expected 108 rows/);
  });
});
