import { describe, it, expect } from 'vitest';
import { buildDesign } from '../../../server/engine/design/build';
import { parseCsvText } from '../../../server/tabular/csv';
import { predictPath, predictRows, type StoredModel } from '../../../server/engine/predict';
import { fitPath } from '../../../server/engine/index';
import { createRng } from '../../../server/engine/random';
import { EngineInputError } from '../../../server/engine/types';
import { expectClose } from '../../support/numbers';

// Training data: numeric x, categorical c with levels a, b, c (one indicator per level).
const train = parseCsvText('y,x,c\n1,0.5,a\n0,1.5,b\n1,2.5,c\n0,3.5,a\n', 'train.csv');
const built = buildDesign(train, { response: 'y', predictors: ['x', 'c'], missing: 'drop', family: 'gaussian' });
const termIndex = (name: string) => built.design.terms.indexOf(name);

function model(family: 'gaussian' | 'binomial', overrides: Partial<StoredModel> = {}): StoredModel {
  const coefficients = new Float64Array(built.design.p);
  coefficients[termIndex('x')] = 2;
  coefficients[termIndex('c=a')] = 0.5;
  coefficients[termIndex('c=b')] = -1;
  return { family, encoding: built.encoding, intercept: 1, coefficients, ...overrides };
}

describe('predictRows', () => {
  it('applies the stored encoding: eta = b0 + 2 x + 0.5 [c=a] - 1 [c=b] (hand computation)', () => {
    const fresh = parseCsvText('c,x\nb,3\na,-1\nc,0.25\n', 'new.csv');
    const { linearPredictor, response } = predictRows(fresh, model('gaussian'));
    const expected = [1 + 6 - 1, 1 - 2 + 0.5, 1 + 0.5];
    expected.forEach((e, i) => {
      expectClose(`eta row ${i + 1}`, linearPredictor[i], e, 1e-15);
      expectClose(`mean row ${i + 1}`, response[i], e, 1e-15);
    });
  });

  it('gives the logistic probability 1 / (1 + exp(-eta)) for binomial', () => {
    const fresh = parseCsvText('x,c\n0,c\n0.25,a\n', 'new.csv');
    const { response } = predictRows(fresh, model('binomial', { intercept: -0.5 }));
    expectClose('p row 1', response[0], 1 / (1 + Math.exp(0.5)), 1e-15);
    expectClose('p row 2', response[1], 1 / (1 + Math.exp(-(-0.5 + 0.5 + 0.5))), 1e-15);
  });

  it('names a missing column', () => {
    const fresh = parseCsvText('x\n1\n', 'new.csv');
    expect(() => predictRows(fresh, model('gaussian'))).toThrow(EngineInputError);
    expect(() => predictRows(fresh, model('gaussian'))).toThrow(/no column "c"/);
  });

  it('names column, level and row of an unseen category level', () => {
    const fresh = parseCsvText('x,c\n1,a\n2,zebra\n', 'new.csv');
    expect(() => predictRows(fresh, model('gaussian'))).toThrow(/column "c" has level "zebra" in row 2/);
  });

  it('names column and row of a missing value when the fit stored no imputation', () => {
    const fresh = parseCsvText('x,c\n1,a\nNA,b\n', 'new.csv');
    expect(() => predictRows(fresh, model('gaussian'))).toThrow(/column "x" has a missing value in row 2/);
  });

  it('uses the stored imputation values when the fit imputed', () => {
    const withGaps = parseCsvText('y,x,c\n1,1,a\n2,NA,b\n3,5,\n4,3,a\n', 'gaps.csv');
    const imputed = buildDesign(withGaps, { response: 'y', predictors: ['x', 'c'], missing: 'impute', family: 'gaussian' });
    const b = new Float64Array(imputed.design.p);
    b[imputed.design.terms.indexOf('x')] = 1;
    b[imputed.design.terms.indexOf('c=a')] = 10;
    const fresh = parseCsvText('x,c\nNA,NA\n', 'new.csv');
    // x imputed by the mean of 1, 5, 3 = 3; c by its most frequent level "a": 0 + 3 + 10.
    const { linearPredictor } = predictRows(fresh, { family: 'gaussian', encoding: imputed.encoding, intercept: 0, coefficients: b });
    expectClose('imputed row', linearPredictor[0], 13, 1e-15);
  });

  it('rejects text in a column the fit used as numeric', () => {
    const fresh = parseCsvText('x,c\nbig,a\n', 'new.csv');
    expect(() => predictRows(fresh, model('gaussian'))).toThrow(/column "x" must be numeric/);
  });
});

describe('predictPath on the rows fitted', () => {
  // Fact of the method (common practice): with an unpenalized intercept, the optimality condition for
  // b0 makes the fitted values sum to sum(y) (gaussian: residuals sum to 0; binomial: the fitted
  // probabilities sum to the number of ones), at every lambda.
  const rng = createRng(17);
  const rows = Array.from({ length: 40 }, (_, i) => {
    const x = 3 + 2 * rng.normal();
    const c = ['u', 'v', 'w'][i % 3];
    const y = 1 + 0.8 * x + (c === 'u' ? 2 : 0) + rng.normal();
    return `${y},${x},${c},${y > 4 ? 1 : 0}`;
  });
  const table = parseCsvText(`y,x,c,flag\n${rows.join('\n')}\n`, 'fit.csv');
  const base = { predictors: ['x', 'c'], penalty: 'lasso' as const, standardize: true, pathLength: 6, tolerance: 1e-12, maxIterations: 100000, screening: 'strong' as const, missing: 'drop' as const, cv: null };

  for (const [family, response] of [['gaussian', 'y'], ['binomial', 'flag']] as const) {
    it(`${family}: fitted values sum to sum(y) at every lambda`, () => {
      const path = fitPath(table, { ...base, family, response });
      const column = table.columns.find((col) => col.name === response);
      if (!column || column.kind !== 'numeric') throw new Error('response column');
      const sumY = column.values.reduce((a, b) => a + b, 0);
      path.lambda.forEach((lambda, l) => {
        const { response: fitted } = predictPath(table, path, l);
        expectClose(`${family} sum of fitted values at lambda ${lambda}`, fitted.reduce((a, b) => a + b, 0), sumY, 1e-6);
      });
    });
  }

  it('rejects a lambda index outside the path', () => {
    const path = fitPath(table, { ...base, family: 'gaussian', response: 'y' });
    expect(() => predictPath(table, path, 6)).toThrow(/lambda index 6 is outside 0\.\.5/);
  });
});
