import { describe, it, expect } from 'vitest';
import { buildDesign } from '../../../server/engine/design/build';
import { parseCsvText } from '../../../server/engine/csv';
import { predictRows, type StoredModel } from '../../../server/engine/predict';
import { EngineInputError } from '../../../server/engine/types';
import { expectClose } from '../cv/close';

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
      expectClose(linearPredictor[i], e, 1e-15, `eta row ${i + 1}`);
      expectClose(response[i], e, 1e-15, `mean row ${i + 1}`);
    });
  });

  it('gives the logistic probability 1 / (1 + exp(-eta)) for binomial', () => {
    const fresh = parseCsvText('x,c\n0,c\n0.25,a\n', 'new.csv');
    const { response } = predictRows(fresh, model('binomial', { intercept: -0.5 }));
    expectClose(response[0], 1 / (1 + Math.exp(0.5)), 1e-15, 'p row 1');
    expectClose(response[1], 1 / (1 + Math.exp(-(-0.5 + 0.5 + 0.5))), 1e-15, 'p row 2');
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
    expectClose(linearPredictor[0], 13, 1e-15, 'imputed row');
  });

  it('rejects text in a column the fit used as numeric', () => {
    const fresh = parseCsvText('x,c\nbig,a\n', 'new.csv');
    expect(() => predictRows(fresh, model('gaussian'))).toThrow(/column "x" must be numeric/);
  });
});
