/**
 * The unpenalized least-squares fit against NIST's certified values.
 * Source of every expected value: NIST StRD, Statistical Reference Datasets, linear least squares
 * (https://www.itl.nist.gov/div898/strd/lls/lls.shtml), transcribed with the data into
 * datasets/reference/nist/*.json (each file names its page and original reference).
 * Bars: Longley and Norris >= 9 significant digits in every estimate, standard deviation and the
 * residual SD; Wampler1 >= 6 (NIST StRD certified values, computed in 500-digit arithmetic; bars as in docs/engine.md, "Outside references in the tests").
 */
import { describe, expect, it } from 'vitest';
import { fitUnpenalized, refitSelected } from '../../../server/engine/unpenalized';
import { designFrom, readJson } from './helpers';
import { expectClose, expectDigits } from '../../support/numbers';

interface NistFixture {
  dataset: string;
  source: string;
  url: string;
  predictors: Record<string, number[]>;
  y: number[];
  certified: {
    estimates: string[];
    standardDeviations: string[];
    residualStandardDeviation: string;
    rSquared: string;
  };
}

const cases = [
  { file: 'longley', digits: 9 },
  { file: 'norris', digits: 9 },
  { file: 'wampler1', digits: 6 },
];

describe('unpenalized gaussian fit reaches NIST StRD certified values', () => {
  for (const { file, digits } of cases) {
    const fixture = readJson<NistFixture>(`datasets/reference/nist/${file}.json`);
    const design = designFrom(fixture.predictors);
    const y = Float64Array.from(fixture.y);
    const cert = fixture.certified;
    const label = `${fixture.dataset} (${fixture.source}, ${fixture.url})`;

    it(`${fixture.dataset}: estimates and standard deviations to ${digits} digits`, () => {
      expect(fixture.source).toBe('NIST StRD, Statistical Reference Datasets, linear least squares');
      const fit = fitUnpenalized(design, y, 'gaussian');
      expect(fit.status).toBe('converged');
      const rows = [fit.intercept, ...fit.coefficients];
      expect(rows.map((r) => r.term)).toEqual(['(intercept)', ...design.terms]);
      rows.forEach((row, k) => {
        expectDigits(`${label} B${k} estimate`, row.estimate, Number(cert.estimates[k]), digits);
        expectDigits(`${label} B${k} standard deviation`, row.standardError, Number(cert.standardDeviations[k]), digits);
      });
      expectDigits(`${label} residual SD`, fit.residualStandardDeviation, Number(cert.residualStandardDeviation), digits);
      expectDigits(`${label} R^2`, fit.rSquared, Number(cert.rSquared), digits);
      expect(fit.residualDf).toBe(fixture.y.length - design.p - 1);
    });

    it(`${fixture.dataset}: the refit on every term gives the same certified values, with the caution`, () => {
      const refit = refitSelected(design, y, 'gaussian', [...design.terms].reverse());
      expect(refit.caution).toMatch(/optimistic/);
      const byTerm = new Map(refit.coefficients.map((r) => [r.term, r]));
      design.terms.forEach((term, j) => {
        expectDigits(`${label} refit ${term}`, byTerm.get(term)?.estimate ?? null, Number(cert.estimates[j + 1]), digits);
      });
    });
  }
});

describe('t statistics and p-values on the Longley fit', () => {
  // Expected: NIST's certified estimates / SDs, p-values from scipy.stats.t (generate.py wrote them).
  const inference = readJson<{ source: string; residualDf: number; statistic: number[]; pValue: number[] }>(
    'datasets/reference/sklearn/longley-inference.json',
  );
  const fixture = readJson<NistFixture>('datasets/reference/nist/longley.json');

  it(`match ${inference.source}`, () => {
    const fit = fitUnpenalized(designFrom(fixture.predictors), Float64Array.from(fixture.y), 'gaussian');
    expect(fit.statisticKind).toBe('t');
    expect(fit.residualDf).toBe(inference.residualDf);
    [fit.intercept, ...fit.coefficients].forEach((row, k) => {
      expectClose(`Longley ${row.term} t`, row.statistic ?? Number.NaN, inference.statistic[k], 1e-9);
      // p-values compared relative to themselves (they are small), to 1e-7.
      expectDigits(`Longley ${row.term} p-value`, row.pValue, inference.pValue[k], 7);
    });
  });
});
