/**
 * lambda = 0 on a path is the unpenalized fit (docs/engine.md; docs/decisions/0005: QR for gaussian, Newton/IRLS for
 * binomial), checked on outside references: NIST StRD Norris (certified values,
 * datasets/reference/nist/norris.json) with standardization on, scikit-learn's unpenalized
 * LogisticRegression (datasets/reference/sklearn/logistic-unpenalized.json), the separable breast
 * cancer columns (datasets/reference/sklearn/separation.json, decided by a linear program), and
 * per-level means for a fully encoded categorical predictor (least squares on indicators; common
 * practice).
 */
import { describe, expect, it } from 'vitest';
import { parseCsvText } from '../../../server/tabular/csv';
import { fitPath, fitPathOnDesign } from '../../../server/engine/index';
import type { FitSpec } from '../../../server/engine/types';
import { designFrom, readJson, readNumericCsv } from './helpers';
import { expectClose, expectDigits } from '../../support/numbers';

interface NistFixture {
  predictors: Record<string, number[]>;
  y: number[];
  certified: { estimates: string[] };
}

describe('lambda = 0 on a path', () => {
  it('gaussian: NIST Norris certified coefficients to 9 digits, with standardization on', () => {
    const nist = readJson<NistFixture>('datasets/reference/nist/norris.json');
    const design = designFrom(nist.predictors);
    const path = fitPathOnDesign(design, Float64Array.from(nist.y), { family: 'gaussian', penalty: 'lasso', standardize: true, lambda: [1, 0.1, 0], tolerance: 1e-8 });
    const [b0, b1] = nist.certified.estimates.map(Number);
    expectDigits('Norris b0 (NIST StRD certified)', path.intercept[2], b0, 9);
    expectDigits('Norris b1 (NIST StRD certified)', path.coefficients[2][0], b1, 9);
    expect(path.solves[2].status, path.solves[2].message).toBe('converged');
    expect(path.solves[2].gap).toBeLessThanOrEqual(1e-8);
    expect(path.solves[2].message).toMatch(/unpenalized fit, least squares by QR/);
  });

  interface UnpenalizedFixture {
    versions: { sklearn: string };
    call: string;
    dataset: { file: string; response: string; terms: string[] };
    intercept: number;
    coef: number[];
  }

  it('binomial: scikit-learn\'s unpenalized logistic fit to 1e-8 (4 breast cancer columns)', () => {
    const fixture = readJson<UnpenalizedFixture>('datasets/reference/sklearn/logistic-unpenalized.json');
    const csv = readNumericCsv(fixture.dataset.file);
    const y = Float64Array.from(csv.columns[fixture.dataset.response]);
    const path = fitPathOnDesign(designFrom(csv.columns, fixture.dataset.terms), y, { family: 'binomial', penalty: 'lasso', standardize: true, lambda: [0.01, 0], tolerance: 1e-8 });
    const source = `scikit-learn ${fixture.versions.sklearn}: ${fixture.call}`;
    expectClose(`intercept (${source})`, path.intercept[1], fixture.intercept, 1e-8);
    fixture.dataset.terms.forEach((term, j) => expectClose(`${term} (${source})`, path.coefficients[1][j], fixture.coef[j], 1e-8));
    expect(path.solves[1].status, path.solves[1].message).toBe('converged');
    expect(path.solves[1].message).toMatch(/Newton\/IRLS/);
  });

  it('binomial with separable columns: finite coefficients, a status and a message that say so', () => {
    const separation = readJson<{ dataset: { file: string; response: string }; cases: { terms: string[]; separable: boolean }[] }>('datasets/reference/sklearn/separation.json');
    const separable = separation.cases.find((c) => c.separable) as { terms: string[] };
    const csv = readNumericCsv(separation.dataset.file);
    const y = Float64Array.from(csv.columns[separation.dataset.response]);
    const path = fitPathOnDesign(designFrom(csv.columns, separable.terms), y, { family: 'binomial', penalty: 'lasso', standardize: true, lambda: [0.01, 0], tolerance: 1e-8 });
    const solve = path.solves[1];
    expect(solve.message).toMatch(/separation/i);
    expect(Number.isFinite(solve.gap)).toBe(true);
    expect(['converged', 'iteration-limit']).toContain(solve.status);
    expect(Number.isFinite(path.intercept[1])).toBe(true);
    expect(path.coefficients[1].every(Number.isFinite)).toBe(true);
  });

  it('a fully encoded categorical predictor: the last level is aliased (coefficient 0, noted) and fitted values are the level means', () => {
    const levels = ['a', 'b', 'c'];
    const ys = [[1.0, 1.4, 0.9, 1.3], [3.1, 2.7, 3.3], [-0.5, 0.2, -0.1, 0.0, 0.4]];
    const rows = ys.flatMap((values, k) => values.map((v) => `${v},${levels[k]}`));
    const table = parseCsvText(`y,group\n${rows.join('\n')}\n`, 'groups.csv');
    const spec: FitSpec = { family: 'gaussian', response: 'y', predictors: ['group'], penalty: 'lasso', standardize: true, lambda: [0.1, 0], pathLength: 2, tolerance: 1e-8, maxIterations: 10000, screening: 'strong', missing: 'drop', cv: null };
    const path = fitPath(table, spec);
    expect(path.terms).toEqual(['group=a', 'group=b', 'group=c']);
    expect(path.coefficients[1][2]).toBe(0);
    expect(path.notes.join('\n')).toMatch(/"group=c" aliased with the intercept/);
    expect(path.solves[1].status, path.solves[1].message).toBe('converged');
    ys.forEach((values, k) => {
      const levelMean = values.reduce((s, v) => s + v, 0) / values.length;
      const fitted = path.intercept[1] + (k < 2 ? path.coefficients[1][k] : 0);
      expectClose(`fitted value of level ${levels[k]} (least squares on indicators = level mean)`, fitted, levelMean, 1e-12);
    });
  });
});
