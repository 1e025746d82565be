/**
 * Bad input gets an EngineInputError naming the field, column or row (COMMON.md quality bar).
 */
import { describe, expect, it } from 'vitest';
import { EngineInputError, fitPath, fitPathOnDesign, validateSpec } from '../../../server/engine/index';
import type { EngineColumn, EngineTable, FitSpec } from '../../../server/engine/types';

const num = (name: string, values: number[]): EngineColumn => ({ name, kind: 'numeric', values: Float64Array.from(values) });
const cat = (name: string, codes: number[], levels: string[]): EngineColumn => ({ name, kind: 'categorical', codes: Int32Array.from(codes), levels });

function table(...columns: EngineColumn[]): EngineTable {
  return { nRows: columns[0] ? (columns[0].kind === 'numeric' ? columns[0].values.length : columns[0].codes.length) : 0, columns };
}

const base: FitSpec = {
  family: 'gaussian',
  response: 'y',
  predictors: ['a', 'b'],
  penalty: 'lasso',
  standardize: true,
  pathLength: 5,
  tolerance: 1e-7,
  maxIterations: 1000,
  screening: 'strong',
  missing: 'drop',
  cv: null,
};
const good = table(num('y', [1, 2, 3, 5, 4, 6]), num('a', [1, 0, 2, 3, 1, 4]), num('b', [2, 1, 1, 0, 3, 1]), cat('g', [0, 1, 0, 1, 0, 1], ['u', 'v']));

function expectInputError(run: () => unknown, field: string, words: string): void {
  let caught: unknown;
  try {
    run();
  } catch (error) {
    caught = error;
  }
  expect(caught, `expected an EngineInputError about ${field}`).toBeInstanceOf(EngineInputError);
  const error = caught as EngineInputError;
  expect(error.field).toBe(field);
  expect(error.message).toContain(words);
}

describe('validateSpec', () => {
  it('accepts a good spec and fits it', () => {
    expect(() => validateSpec(good, base)).not.toThrow();
    expect(fitPath(good, base).lambda.length).toBe(5);
  });

  const cases: [string, EngineTable, Partial<FitSpec>, string, string][] = [
    ['empty data', table(), {}, 'data', 'no rows'],
    ['one row', table(num('y', [1]), num('a', [1]), num('b', [2])), {}, 'data', 'one row'],
    ['constant response', table(num('y', [2, 2, 2, 2]), num('a', [1, 2, 3, 4]), num('b', [1, 0, 1, 0])), {}, 'response', 'constant'],
    ['binomial response not 0/1', good, { family: 'binomial' }, 'response', 'row 2 has 2'],
    ['binomial response with three levels', table(cat('y', [0, 1, 2, 0], ['p', 'q', 'r']), num('a', [1, 2, 3, 4]), num('b', [1, 0, 1, 0])), { family: 'binomial' }, 'response', 'exactly two'],
    ['gaussian categorical response', table(cat('y', [0, 1, 0, 1], ['p', 'q']), num('a', [1, 2, 3, 4]), num('b', [1, 0, 1, 0])), {}, 'response', 'numeric'],
    ['all-missing column', table(num('y', [1, 2, 3, 4]), num('a', [NaN, NaN, NaN, NaN]), num('b', [1, 0, 1, 0])), {}, 'a', 'all missing'],
    ['non-finite value', table(num('y', [1, 2, 3, 4]), num('a', [1, Infinity, 3, 4]), num('b', [1, 0, 1, 0])), {}, 'a', 'row 2'],
    ['non-finite response', table(num('y', [1, -Infinity, 3, 4]), num('a', [1, 2, 3, 4]), num('b', [1, 0, 1, 0])), {}, 'response', 'row 2'],
    ['negative lambda', good, { lambda: [1, -0.5] }, 'lambda', 'value 2 is -0.5'],
    ['lambda not descending', good, { lambda: [0.1, 0.5] }, 'lambda', 'descending'],
    ['l1Share 0', good, { penalty: 'elastic-net', l1Share: 0 }, 'l1Share', '(0, 1]'],
    ['l1Share above 1', good, { penalty: 'elastic-net', l1Share: 1.5 }, 'l1Share', '(0, 1]'],
    ['elastic net without l1Share', good, { penalty: 'elastic-net' }, 'l1Share', 'needs an L1 share'],
    ['l1Share on the lasso', good, { l1Share: 0.5 }, 'l1Share', 'only to the elastic-net'],
    ['zero path decades', good, { pathDecades: 0 }, 'pathDecades', 'positive'],
    ['fractional max terms', good, { maxTerms: 2.5 }, 'maxTerms', 'whole number'],
    ['max terms with explicit lambdas', good, { lambda: [1, 0.1], maxTerms: 3 }, 'maxTerms', 'automatic path'],
    ['unknown response', good, { response: 'zz' }, 'response', '"zz"'],
    ['unknown predictor', good, { predictors: ['a', 'nope'] }, 'predictors', '"nope"'],
    ['overlapping groups', good, { penalty: 'group-lasso', groups: { one: ['a', 'b'], two: ['b'] } }, 'groups', 'two groups'],
    ['group with unknown column', good, { penalty: 'group-lasso', groups: { one: ['a', 'zz'] } }, 'groups', '"zz"'],
    ['negative penalty weight', good, { penaltyWeights: { a: -1 } }, 'penaltyWeights', '"a"'],
    ['penalty weight for unknown column', good, { penaltyWeights: { q: 1 } }, 'penaltyWeights', '"q"'],
    ['zero tolerance', good, { tolerance: 0 }, 'tolerance', 'positive'],
    ['too few folds', good, { cv: { folds: 1, seed: 1 } }, 'folds', 'folds'],
  ];
  for (const [name, data, change, field, words] of cases) {
    it(`${name} -> EngineInputError naming ${field}`, () => {
      expectInputError(() => validateSpec(data, { ...base, ...change }), field, words);
      expectInputError(() => fitPath(data, { ...base, ...change }), field, words);
    });
  }

  it('every predictor constant -> EngineInputError naming predictors', () => {
    const data = table(num('y', [1, 2, 3, 4]), num('a', [1, 1, 1, 1]), num('b', [5, 5, 5, 5]));
    expectInputError(() => fitPath(data, base), 'predictors', 'constant');
  });

  it('fitPathOnDesign rejects bad lambdas, l1Share and penalty weights too', () => {
    const design = { n: 4, p: 1, x: Float64Array.from([1, 2, 3, 5]), terms: ['a'] };
    const y = Float64Array.from([1, 0, 2, 3]);
    const options = { family: 'gaussian' as const, penalty: 'lasso' as const, standardize: true };
    expectInputError(() => fitPathOnDesign(design, y, { ...options, lambda: [1, 2] }), 'lambda', 'descending');
    expectInputError(() => fitPathOnDesign(design, y, { ...options, penalty: 'elastic-net', l1Share: -0.1 }), 'l1Share', '(0, 1]');
    expectInputError(() => fitPathOnDesign(design, y, { ...options, penaltyWeights: [-2] }), 'penaltyWeights', '"a"');
    expectInputError(() => fitPathOnDesign(design, Float64Array.from([1, 1, 1, 1]), options), 'response', 'constant');
    expectInputError(() => fitPathOnDesign(design, y, { ...options, family: 'binomial' }), 'response', '0 or 1');
    const huge = { ...design, x: Float64Array.from([1e160, -1e160, 3e160, 0]) };
    expectInputError(() => fitPathOnDesign(huge, y, { ...options, standardize: false }), 'a', 'too large');
    expectInputError(() => fitPathOnDesign(huge, y, options), 'a', 'too large');
  });
});
