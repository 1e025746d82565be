import { describe, it, expect } from 'vitest';
import { assignFolds, checkFoldsNonEmpty, foldIdsFromColumn } from '../../../server/engine/cv/folds';
import { createRng } from '../../../server/engine/random';
import { EngineInputError } from '../../../server/engine/types';

const uniform = (seed: number) => {
  const rng = createRng(seed);
  return () => rng.next();
};

function counts(ids: Int32Array, folds: number, where: (i: number) => boolean = () => true): number[] {
  const c = new Array(folds).fill(0);
  ids.forEach((f, i) => { if (where(i)) c[f]++; });
  return c;
}

describe('assignFolds', () => {
  it('gives near-equal folds (sizes differ by at most one)', () => {
    const c = counts(assignFolds(103, 10, uniform(1)), 10);
    expect(Math.max(...c) - Math.min(...c)).toBeLessThanOrEqual(1);
    expect(c.reduce((a, b) => a + b, 0)).toBe(103);
  });

  it('stratifies: each fold holds each class in proportion, to within one row', () => {
    // 30% class 1, 70% class 0 over 200 rows; with 5 folds each fold should get 12 ones and 28 zeros.
    const y = Array.from({ length: 200 }, (_, i) => (i % 10 < 3 ? 1 : 0));
    const ids = assignFolds(200, 5, uniform(3), y);
    const ones = counts(ids, 5, (i) => y[i] === 1);
    const zeros = counts(ids, 5, (i) => y[i] === 0);
    for (let f = 0; f < 5; f++) {
      expect(Math.abs(ones[f] - 60 / 5), `fold ${f} ones ${ones[f]}`).toBeLessThanOrEqual(1);
      expect(Math.abs(zeros[f] - 140 / 5), `fold ${f} zeros ${zeros[f]}`).toBeLessThanOrEqual(1);
    }
  });

  it('is deterministic for a seed and differs across seeds', () => {
    const a = assignFolds(50, 5, uniform(42));
    expect(Array.from(assignFolds(50, 5, uniform(42)))).toEqual(Array.from(a));
    expect(Array.from(assignFolds(50, 5, uniform(43)))).not.toEqual(Array.from(a));
  });

  it('rejects K < 2 and K > n', () => {
    expect(() => assignFolds(10, 1, uniform(1))).toThrow(/folds must be an integer of at least 2 \(got 1\)/);
    expect(() => assignFolds(10, 11, uniform(1))).toThrow(/folds \(11\) cannot exceed the number of usable rows \(10\)/);
    expect(() => assignFolds(10, 11, uniform(1))).toThrow(EngineInputError);
  });
});

describe('foldIdsFromColumn', () => {
  it('maps distinct ids in ascending order to 0..K-1', () => {
    const { foldIds, folds } = foldIdsFromColumn('f', [7, -2, 7, 30, -2]);
    expect(folds).toBe(3);
    expect(Array.from(foldIds)).toEqual([1, 0, 1, 2, 0]);
  });
  it('rejects non-integers and missing values naming column and row', () => {
    expect(() => foldIdsFromColumn('f', [1, 2.5])).toThrow(/fold column "f" must hold integer fold ids; row 2 has 2\.5/);
    expect(() => foldIdsFromColumn('f', [1, Number.NaN])).toThrow(/row 2 has a missing value/);
  });
  it('rejects a single fold id', () => {
    expect(() => foldIdsFromColumn('f', [4, 4, 4])).toThrow(/at least 2 distinct fold ids \(found 1\)/);
  });
});

describe('checkFoldsNonEmpty', () => {
  it('names an empty fold', () => {
    expect(() => checkFoldsNonEmpty(Int32Array.from([0, 0, 2]), 3)).toThrow(/fold 2 of 3 has no rows/);
  });
});
