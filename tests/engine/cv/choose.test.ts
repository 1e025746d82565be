import { describe, it, expect } from 'vitest';
import { mean, sampleStandardDeviation } from 'simple-statistics';
import { chooseLambdas, summarizeFolds } from '../../../server/engine/cv/choose';
import { expectClose } from '../../support/numbers';

describe('summarizeFolds', () => {
  it('mean over folds and standard error = sample sd / sqrt(K) (simple-statistics)', () => {
    const perFold = [[1, 4], [2, 6], [4, 5], [5, 9]];
    const { mean: m, standardError } = summarizeFolds(perFold);
    for (const l of [0, 1]) {
      const column = perFold.map((f) => f[l]);
      expectClose(`mean at ${l}`, m[l], mean(column), 1e-14);
      expectClose(`se at ${l}`, standardError[l], sampleStandardDeviation(column) / Math.sqrt(4), 1e-14);
    }
  });
  it('leaves undefined fold values out (e.g. AUC of a one-class held-out set)', () => {
    const { mean: m, standardError } = summarizeFolds([[0.8], [Number.NaN], [0.6]]);
    expectClose('mean', m[0], 0.7, 1e-14);
    expectClose('se', standardError[0], sampleStandardDeviation([0.8, 0.6]) / Math.sqrt(2), 1e-14);
  });
});

describe('chooseLambdas', () => {
  // A constructed U-shaped curve over a descending grid; the minimum is at index 4 (mean 1.0,
  // se 0.3), so the one-SE threshold is 1.3: the largest lambda with mean <= 1.3 is index 2 (1.25).
  const lambda = [10, 5, 2.5, 1.2, 0.6, 0.3, 0.15];
  const curve = {
    mean: [3, 1.9, 1.25, 1.05, 1.0, 1.1, 1.4],
    standardError: [0.5, 0.4, 0.3, 0.3, 0.3, 0.3, 0.3],
  };
  it('picks the minimum and the one-standard-error lambda', () => {
    const { minimum, oneStandardError } = chooseLambdas(lambda, curve);
    expect(minimum).toEqual({ index: 4, lambda: 0.6 });
    expect(oneStandardError).toEqual({ index: 2, lambda: 2.5 });
  });
  it('uses the largest lambda among tied minima', () => {
    const { minimum } = chooseLambdas([3, 2, 1], { mean: [2, 1, 1], standardError: [0, 0, 0] });
    expect(minimum.index).toBe(1);
  });
  it('equals the minimum when no larger lambda is within one SE', () => {
    const { oneStandardError } = chooseLambdas([3, 2, 1], { mean: [5, 4, 1], standardError: [1, 1, 0.1] });
    expect(oneStandardError.index).toBe(2);
  });
});
