/**
 * How the unpenalized fit reports the cases with no ordinary answer: separation in logistic
 * regression, aliased (linearly dependent) terms, and bad input.
 * Sources: separation of the breast cancer data is decided outside Lariat by a linear program
 * (datasets/reference/sklearn/separation.json, scipy HiGHS, written by generate.py). The small
 * hand-made cases rest on facts of the method (common practice): a predictor that splits the classes
 * has no finite maximum-likelihood estimate (Albert & Anderson 1984, Biometrika 71, 1-10), and a
 * column equal to a combination of others cannot be estimated separately.
 */
import { describe, expect, it } from 'vitest';
import { fitUnpenalized, refitSelected } from '../../../server/engine/unpenalized';
import { EngineInputError } from '../../../server/engine/types';
import { designFrom, readJson, readNumericCsv } from './helpers';
import { expectClose } from '../../support/numbers';

interface SeparationFixture {
  source: string;
  dataset: { file: string; sha256: string; response: string };
  cases: { terms: string[]; separable: boolean }[];
}

describe('binomial separation is reported, never returned as NaN', () => {
  const fixture = readJson<SeparationFixture>('datasets/reference/sklearn/separation.json');
  const csv = readNumericCsv(fixture.dataset.file);
  const y = Float64Array.from(csv.columns[fixture.dataset.response]);

  for (const { terms, separable } of fixture.cases) {
    it(`breast cancer with ${terms.length} predictors: separable = ${separable} (${fixture.source})`, () => {
      expect(csv.sha256).toBe(fixture.dataset.sha256);
      const fit = fitUnpenalized(designFrom(csv.columns, terms), y, 'binomial');
      if (separable) {
        expect(fit.status, fit.message).toBe('separation');
        expect(fit.message).toMatch(/separation/i);
        expect(fit.separatedRows).toBeGreaterThan(0);
        for (const row of fit.coefficients) expect(row.standardError).toBeNull();
      } else {
        expect(fit.status, fit.message).toBe('converged');
        expect(fit.separatedRows).toBe(0);
      }
      for (const row of [fit.intercept, ...fit.coefficients]) expect(Number.isNaN(row.estimate)).toBe(false);
    });
  }

  it('complete separation in one predictor (x < 3.5 are all 0, the rest 1)', () => {
    const design = { n: 6, p: 1, x: Float64Array.from([1, 2, 3, 4, 5, 6]), terms: ['x'] };
    const fit = fitUnpenalized(design, Float64Array.from([0, 0, 0, 1, 1, 1]), 'binomial');
    expect(fit.status).toBe('separation');
    expect(fit.message).toMatch(/Complete separation/);
    expect(fit.separatedRows).toBe(6);
    expect(fit.coefficients[0].pValue).toBeNull();
  });

  it('quasi-complete separation: classes overlap only at x = 3', () => {
    const design = { n: 8, p: 1, x: Float64Array.from([1, 2, 3, 3, 3, 3, 4, 5]), terms: ['x'] };
    const fit = fitUnpenalized(design, Float64Array.from([0, 0, 0, 1, 0, 1, 1, 1]), 'binomial');
    expect(fit.status).toBe('separation');
    expect(fit.message).toMatch(/Quasi-complete separation: 4 of 8 rows/);
  });
});

describe('aliased terms are named', () => {
  // Norris's data (NIST StRD) with a copy of x scaled by 2: the copy cannot be estimated.
  const norris = readJson<{ predictors: { x: number[] }; y: number[]; certified: { estimates: string[] } }>(
    'datasets/reference/nist/norris.json',
  );
  const x = norris.predictors.x;

  it('a column that is a multiple of an earlier one is left out and reported', () => {
    const design = designFrom({ x, x2: x.map((v) => 2 * v), c: x.map(() => 5) });
    const fit = fitUnpenalized(design, Float64Array.from(norris.y), 'gaussian');
    expect(fit.status).toBe('rank-deficient');
    expect(fit.aliased).toEqual(['x2', 'c']);
    expect(fit.message).toContain("'x2', 'c'");
    expect(fit.coefficients.map((r) => r.term)).toEqual(['x']);
    // The remaining fit is the plain Norris fit (NIST certified slope).
    expectClose('Norris slope with aliased copies', fit.coefficients[0].estimate, Number(norris.certified.estimates[1]), 1e-9);
    expect(fit.residualDf).toBe(x.length - 2);
  });

  it('refitSelected rejects unknown and repeated terms by name', () => {
    const design = designFrom({ x });
    const y = Float64Array.from(norris.y);
    expect(() => refitSelected(design, y, 'gaussian', ['nope'])).toThrow(/'nope'/);
    expect(() => refitSelected(design, y, 'gaussian', ['x', 'x'])).toThrow(/listed twice/);
  });
});

describe('bad input gets a clear error', () => {
  const design = { n: 4, p: 1, x: Float64Array.from([1, 2, Number.NaN, 4]), terms: ['dose'] };

  it('names the term and row of a missing value', () => {
    expect(() => fitUnpenalized(design, Float64Array.from([1, 2, 3, 4]), 'gaussian')).toThrow(
      /Term 'dose' has a missing or non-finite value in row 3/,
    );
  });

  it('rejects a non-0/1 binomial response and a single class', () => {
    const ok = { ...design, x: Float64Array.from([1, 2, 3, 4]) };
    expect(() => fitUnpenalized(ok, Float64Array.from([0, 1, 2, 1]), 'binomial')).toThrow(/row 3 has 2/);
    expect(() => fitUnpenalized(ok, Float64Array.from([1, 1, 1, 1]), 'binomial')).toThrow(EngineInputError);
  });

  it('needs more rows than coefficients', () => {
    const two = { n: 2, p: 1, x: Float64Array.from([1, 2]), terms: ['dose'] };
    expect(() => fitUnpenalized(two, Float64Array.from([1, 3]), 'gaussian')).toThrow(/more rows/);
  });
});
