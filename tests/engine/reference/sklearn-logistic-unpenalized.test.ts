/**
 * The unpenalized binomial fit (Newton/IRLS) against scikit-learn's LogisticRegression(penalty=None)
 * on four columns of the breast cancer data (not separated), with standard errors from the inverse
 * Fisher information computed by numpy at scikit-learn's estimate.
 * Source: datasets/reference/sklearn/logistic-unpenalized.json, written by generate.py beside it
 * (scikit-learn version and the exact call are inside the fixture).
 */
import { describe, expect, it } from 'vitest';
import { fitUnpenalized, refitSelected } from '../../../server/engine/unpenalized';
import { designFrom, readJson, readNumericCsv } from './helpers';
import { expectClose, expectDigits } from '../../support/numbers';

interface UnpenalizedFixture {
  source: string;
  versions: { sklearn: string };
  dataset: { file: string; sha256: string; response: string; terms: string[] };
  call: string;
  intercept: number;
  coef: number[];
  interceptStandardError: number;
  coefStandardError: number[];
  pValueSource: string;
  pValue: number[];
}

const fixture = readJson<UnpenalizedFixture>('datasets/reference/sklearn/logistic-unpenalized.json');
const csv = readNumericCsv(fixture.dataset.file);
const y = Float64Array.from(csv.columns[fixture.dataset.response]);
const source = `scikit-learn ${fixture.versions.sklearn}: ${fixture.call}`;

describe('unpenalized logistic fit matches scikit-learn (breast cancer, 4 columns)', () => {
  it('reads the same data the fixture was made from', () => {
    expect(csv.sha256).toBe(fixture.dataset.sha256);
  });

  it('estimates within 1e-8 and standard errors within 1e-7 (relative)', () => {
    const fit = fitUnpenalized(designFrom(csv.columns, fixture.dataset.terms), y, 'binomial');
    expect(fit.status, fit.message).toBe('converged');
    expect(fit.statisticKind).toBe('z');
    expectClose(`intercept (${source})`, fit.intercept.estimate, fixture.intercept, 1e-8);
    expectClose(`intercept SE (${source})`, fit.intercept.standardError ?? Number.NaN, fixture.interceptStandardError, 1e-7);
    fixture.dataset.terms.forEach((term, j) => {
      const row = fit.coefficients[j];
      expect(row.term).toBe(term);
      expectClose(`${term} (${source})`, row.estimate, fixture.coef[j], 1e-8);
      expectClose(`${term} SE (${source})`, row.standardError ?? Number.NaN, fixture.coefStandardError[j], 1e-7);
      // Wald z and its two-sided normal p-value follow from the reference estimate and SE.
      expectClose(`${term} z`, row.statistic ?? Number.NaN, fixture.coef[j] / fixture.coefStandardError[j], 1e-6);
      // p-values relative to themselves (down to 1e-19 here), from scipy's normal distribution.
      expectDigits(`${term} p-value (${fixture.pValueSource})`, row.pValue, fixture.pValue[j + 1], 5);
    });
    expectDigits(`intercept p-value (${fixture.pValueSource})`, fit.intercept.pValue, fixture.pValue[0], 5);
  });

  it('the refit on a selected support carries the post-selection caution', () => {
    const design = designFrom(csv.columns, csv.header.slice(0, -1));
    const refit = refitSelected(design, y, 'binomial', fixture.dataset.terms);
    expect(refit.caution).toMatch(/too optimistic/);
    expectClose(`refit intercept (${source})`, refit.intercept.estimate, fixture.intercept, 1e-8);
  });
});
