/**
 * Summaries. Reference: NIST StRD univariate summary statistics, dataset NumAcc1 (values 10000001,
 * 10000003, 10000002; certified mean 10000002, standard deviation 1; values from memory). Quartiles:
 * Hyndman & Fan (1996) "Sample quantiles in statistical packages", definition 7 (R's default), which
 * simple-statistics' quantileSorted implements: x[(n-1)p] interpolated; for 1..8 that is 2.75, 4.5,
 * 6.25 (worked by hand). Histogram bins: Sturges (1926), k = ceil(log2 n) + 1.
 */
import { describe, expect, it } from 'vitest';
import { summarize } from '../../../server/datasets/summary';

const close = (got: number | undefined, want: number, tol = 1e-12) => {
  const g = got ?? Number.NaN;
  expect(Math.abs(g - want) <= tol * Math.max(1, Math.abs(g), Math.abs(want)), `expected ${want}, got ${g}, tol ${tol}`).toBe(true);
};

describe('summarize', () => {
  it('NIST NumAcc1: mean and sd certified values, missing counted apart', () => {
    const s = summarize({ name: 'y', kind: 'numeric', values: Float64Array.from([10000001, Number.NaN, 10000003, 10000002]) });
    expect(s).toMatchObject({ count: 4, missing: 1, distinct: 3, min: 10000001, max: 10000003 });
    close(s.mean, 10000002);
    close(s.sd, 1);
  });

  it('quartiles and Sturges histogram of 1..8', () => {
    const s = summarize({ name: 'x', kind: 'numeric', values: Float64Array.from([8, 3, 1, 5, 2, 7, 6, 4]) });
    close(s.q1, 2.75); // (n-1)p = 1.75: 2 + 0.75 * (3 - 2)
    close(s.median, 4.5);
    close(s.q3, 6.25);
    expect(s.histogram?.length).toBe(4); // ceil(log2 8) + 1
    expect(s.histogram?.map((b) => b.count)).toEqual([2, 2, 2, 2]);
  });

  it('level counts, most frequent first', () => {
    const s = summarize({ name: 'g', kind: 'categorical', levels: ['a', 'b', 'c'], codes: Int32Array.from([1, 1, -1, 0, 1]) });
    expect(s).toMatchObject({ count: 5, missing: 1, distinct: 2, levels: [{ level: 'b', count: 3 }, { level: 'a', count: 1 }] });
  });
});
