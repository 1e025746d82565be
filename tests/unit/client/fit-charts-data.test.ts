/**
 * The pure helpers behind the results charts and the column table: which paths are drawn, the L1
 * norm axis, Q-Q quantiles, the confusion table, and column name patterns.
 */
import { describe, expect, it } from 'vitest';
import { namePattern, missingShare } from '@/components/columns/filter';
import { confusionAt, qqPoints } from '@/features/fits/charts/diagnosticsData';
import { l1Norms, peakSizes, termPath, topTerms } from '@/features/fits/charts/pathData';
import type { ColumnSchema } from '@shared/datasets';

const close = (a: number, b: number, tol = 1e-12) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(a), Math.abs(b));

describe('coefficient path data', () => {
  // Three lambdas over four terms; term 3 never enters. Written out by hand.
  const coefficients = [
    { terms: [], values: [] },
    { terms: [1], values: [-0.5] },
    { terms: [0, 1, 2], values: [0.2, -1.5, 0.7] },
  ];

  it('ranks terms by the largest size they reach and leaves out terms that never enter', () => {
    const peak = peakSizes(coefficients, 4);
    expect(Array.from(peak)).toEqual([0.2, 1.5, 0.7, 0]);
    expect(topTerms(peak, 2)).toEqual([1, 2]);
    expect(topTerms(peak, 10)).toEqual([1, 2, 0]);
  });

  it('sums absolute coefficients for the L1-norm axis; a path has zeros where the term is absent, in increasing x', () => {
    const norms = l1Norms(coefficients);
    expect(norms[0]).toBe(0);
    expect(close(norms[2], 2.4)).toBe(true);
    expect(termPath(coefficients, 2, [30, 20, 10])).toEqual([
      { i: 2, x: 10, y: 0.7 },
      { i: 1, x: 20, y: 0 },
      { i: 0, x: 30, y: 0 },
    ]);
  });
});

describe('diagnostics data', () => {
  it('puts sorted standardized residuals against normal quantiles at (i - 0.5) / n', () => {
    const points = qqPoints([3, -1, 1]);
    // mean 1, sd 2 -> standardized residuals -1, 0, 1 once sorted.
    expect(points.map((p) => p.y)).toEqual([-1, 0, 1]);
    // The middle plotting position is 0.5, whose normal quantile is 0 (common practice); the outer
    // ones are symmetric: the quantiles at 1/6 and 5/6 are -/+0.9674215661017 (from memory, checked by symmetry here).
    expect(close(points[1].x, 0)).toBe(true);
    expect(close(points[0].x, -points[2].x)).toBe(true);
    expect(close(points[2].x, 0.9674215661017, 1e-9)).toBe(true);
  });

  it('counts a confusion table at a threshold (predicted yes when probability >= threshold)', () => {
    const p = [0.9, 0.6, 0.4, 0.1, 0.5];
    const y: (0 | 1)[] = [1, 0, 1, 0, 1];
    expect(confusionAt(p, y, 0.5)).toEqual({ truePositive: 2, falsePositive: 1, trueNegative: 1, falseNegative: 1 });
    expect(confusionAt(p, y, 0.95)).toEqual({ truePositive: 0, falsePositive: 0, trueNegative: 2, falseNegative: 3 });
  });
});

describe('column name patterns', () => {
  it('matches plain text anywhere and wildcards against the whole name, ignoring case', () => {
    expect(namePattern('fat')('milk_FAT_pct')).toBe(true);
    expect(namePattern('sensor_*')('sensor_07')).toBe(true);
    expect(namePattern('sensor_*')('old_sensor_07')).toBe(false);
    expect(namePattern('sensor_0?')('sensor_07')).toBe(true);
    expect(namePattern('sensor_0?')('sensor_17')).toBe(false);
    expect(namePattern('a.b*')('axb')).toBe(false);
    expect(namePattern('')('anything')).toBe(true);
  });

  it('reads the missing share from the summary counts', () => {
    const column = { summary: { count: 200, missing: 50, distinct: 3 } } as unknown as ColumnSchema;
    expect(missingShare(column)).toBe(0.25);
  });
});
