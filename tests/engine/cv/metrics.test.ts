import { describe, it, expect } from 'vitest';
import { mean, rootMeanSquare } from 'simple-statistics';
import {
  areaUnderRoc,
  meanAbsoluteError,
  meanBinomialDeviance,
  meanSquaredError,
  misclassificationRate,
} from '../../../server/engine/cv/metrics';
import { expectClose } from '../../support/numbers';

describe('gaussian held-out losses', () => {
  const y = [3, -1, 2.5, 7, 0];
  const eta = [2.5, 0, 2, 8, -0.5];
  const residuals = y.map((v, i) => v - eta[i]);

  it('mean squared error is the squared root-mean-square of the residuals (simple-statistics)', () => {
    expectClose('mse', meanSquaredError(y, eta), rootMeanSquare(residuals) ** 2, 1e-14);
  });
  it('mean absolute error is the mean of |residual| (simple-statistics mean)', () => {
    expectClose('mae', meanAbsoluteError(y, eta), mean(residuals.map(Math.abs)), 1e-14);
  });
});

describe('binomial held-out losses', () => {
  it('deviance at eta = 0 is 2 log 2 per row whatever the class (explicit formula -2 log 0.5)', () => {
    expectClose('deviance', meanBinomialDeviance([0, 1, 1], [0, 0, 0]), 2 * Math.log(2), 1e-14);
  });
  it('deviance equals -2 [y log p + (1 - y) log(1 - p)] with p = 1/(1 + e^-eta) (explicit formula)', () => {
    const y = [1, 0, 1, 0];
    const eta = [2, -1.5, -0.3, 0.7];
    const expected =
      y.reduce((s, yi, i) => {
        const p = 1 / (1 + Math.exp(-eta[i]));
        return s - 2 * (yi * Math.log(p) + (1 - yi) * Math.log(1 - p));
      }, 0) / y.length;
    expectClose('deviance', meanBinomialDeviance(y, eta), expected, 1e-13);
  });
  it('deviance stays finite for extreme linear predictors (-2 * -800 = 1600 for y=0, eta=800)', () => {
    expectClose('deviance', meanBinomialDeviance([0, 1], [800, 800]), 1600 / 2, 1e-12);
  });
  it('misclassification counts eta > 0 as class 1 (hand count: 2 of 5 wrong)', () => {
    expect(misclassificationRate([1, 0, 1, 0, 1], [0.3, -2, -0.1, 4, 9])).toBe(2 / 5);
  });
});

describe('AUC (Mann-Whitney, ties count half)', () => {
  it('reproduces the CT rating example of Hanley & McNeil (1982), Table 1: area 0.893', () => {
    // Ratings 1..5 of 58 normal and 51 abnormal images; published area W = 0.893 (value from memory
    // of the paper, confirmed below by the explicit pair count).
    const normal = [33, 6, 6, 11, 2];
    const abnormal = [3, 2, 2, 11, 33];
    const y: number[] = [];
    const s: number[] = [];
    normal.forEach((c, k) => { for (let i = 0; i < c; i++) { y.push(0); s.push(k + 1); } });
    abnormal.forEach((c, k) => { for (let i = 0; i < c; i++) { y.push(1); s.push(k + 1); } });
    const auc = areaUnderRoc(y, s);
    expectClose('AUC of Hanley & McNeil Table 1', auc, 0.893, 5e-4);
    // Explicit definition: P(score_pos > score_neg) + 0.5 P(tie), over all pairs.
    let pairs = 0;
    for (let a = 0; a < 5; a++) for (let b = 0; b < 5; b++) {
      pairs += abnormal[a] * normal[b] * (a > b ? 1 : a === b ? 0.5 : 0);
    }
    expectClose('AUC by pair count', auc, pairs / (58 * 51), 1e-14);
  });
  it('is 1 for perfect ordering, 0 for reversed, 0.5 for all ties', () => {
    expect(areaUnderRoc([0, 0, 1, 1], [1, 2, 3, 4])).toBe(1);
    expect(areaUnderRoc([1, 1, 0, 0], [1, 2, 3, 4])).toBe(0);
    expect(areaUnderRoc([1, 0, 1, 0], [5, 5, 5, 5])).toBe(0.5);
  });
  it('is NaN with a single class', () => {
    expect(areaUnderRoc([1, 1], [0.2, 0.4])).toBeNaN();
  });
  it('is NaN when a score is NaN (no order is defined)', () => {
    expect(areaUnderRoc([1, 0, 1], [0.2, Number.NaN, 0.4])).toBeNaN();
  });
  it('equals the pair count exactly on scores with many ties (and -0 tied with 0)', () => {
    for (let trial = 0; trial < 20; trial++) {
      const n = 40 + trial;
      const y = Array.from({ length: n }, (_, i) => ((i * 7 + trial) % 3 === 0 ? 1 : 0));
      const s = Array.from({ length: n }, (_, i) => {
        const v = ((i * 13 + trial * 5) % 9) - 4;
        return v === 0 && i % 2 === 0 ? -0 : v / 2;
      });
      let pairs = 0;
      let npos = 0;
      for (let a = 0; a < n; a++) {
        if (y[a] !== 1) continue;
        npos++;
        for (let b = 0; b < n; b++) if (y[b] !== 1) pairs += s[a] > s[b] ? 1 : s[a] === s[b] ? 0.5 : 0;
      }
      expect(areaUnderRoc(y, s), `trial ${trial}`).toBe(pairs / (npos * (n - npos)));
    }
  });
});
