/**
 * Cross products for cross-validation folds: S(training rows) = S(all rows) - S(held-out rows)
 * about a common centre (sums over disjoint rows add; common practice), checked against the sums
 * written out here, and a gaussian path fitted from them against the same path fitted from X.
 */
import { describe, expect, it } from 'vitest';
import { constantColumns, crossProducts, fitPathOnDesign, selectRows, subtractCrossProducts } from '../../../server/engine/index';
import { blockCrossProducts, constantOutside } from '../../../server/engine/core/crossProducts';
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

  it('fold blocks: each block is its rows\' sums about the common centre, and S(all) is the full cross products', () => {
    // 3 blocks, uneven, interleaved; a centred copy of 8 columns holds about 7000 rows per chunk, so
    // a tall copy of the design also checks sums over several chunks.
    const tall = randomDesign(9000, 8, 43);
    for (let k = 0; k < tall.x.length; k++) tall.x[k] += 500;
    const ty = linearResponse(tall, [1, -0.5, 0, 0.25], 0.5, 44);
    const blockOf = Int32Array.from({ length: tall.n }, (_, i) => (i % 7 === 0 ? 2 : i % 3 === 0 ? 1 : 0));
    const { blocks, all, ranges } = blockCrossProducts(tall, blockOf, 3, ty);
    const direct = crossProducts(tall, undefined, undefined, ty);
    const close = (label: string, got: number, want: number) => {
      const bound = 1e-12 * Math.max(1, Math.abs(want));
      expect(Math.abs(got - want), `${label}: expected ${want}, got ${got}, tolerance ${bound}`).toBeLessThanOrEqual(bound);
    };
    direct.sums.forEach((v, t) => close(`S(all)[${t}]`, all.sums[t], v));
    direct.response!.cross.forEach((v, j) => close(`X'y[${j}]`, all.response!.cross[j], v));
    // The diagonal, column sums and response sums (which set the grid) are exactly the direct ones.
    for (let j = 0; j < tall.p; j++) expect(all.sums[j * tall.p + j]).toBe(direct.sums[j * tall.p + j]);
    expect(Array.from(all.colSums!)).toEqual(Array.from(direct.colSums!));
    expect(all.response!.squares).toBe(direct.response!.squares);
    for (let b = 0; b < 3; b++) {
      const rows = Array.from(blockOf.keys()).filter((i) => blockOf[i] === b);
      const own = crossProducts(tall, rows, direct.center, ty, direct.response!.center);
      expect(blocks[b].rows).toBe(rows.length);
      own.sums.forEach((v, t) => close(`block ${b} S[${t}]`, blocks[b].sums[t], v));
      for (let j = 0; j < tall.p; j++) {
        const values = rows.map((i) => tall.x[j * tall.n + i]);
        expect(ranges[b].min[j]).toBe(Math.min(...values));
        expect(ranges[b].max[j]).toBe(Math.max(...values));
      }
    }
  });

  it('fold blocks: a column constant over the training rows is found from the block ranges', () => {
    const d = randomDesign(30, 3, 45);
    const blockOf = Int32Array.from({ length: 30 }, (_, i) => i % 3);
    // Column 1 is 4 outside block 2 and varies inside it; column 2 is 7 everywhere.
    for (let i = 0; i < 30; i++) {
      d.x[30 + i] = blockOf[i] === 2 ? i : 4;
      d.x[60 + i] = 7;
    }
    const { ranges } = blockCrossProducts(d, blockOf, 3);
    for (let b = 0; b < 3; b++) {
      const train = Array.from({ length: 30 }, (_, i) => i).filter((i) => blockOf[i] !== b);
      expect(Array.from(constantOutside(ranges, b, 3)), `training rows of block ${b}`).toEqual(Array.from(constantColumns(d, train)));
    }
    expect(Array.from(constantOutside(ranges, 2, 3))).toEqual([0, 1, 1]);
  });
});
