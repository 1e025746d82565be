/**
 * Encoding (docs/engine.md, "Data and encoding"): categorical -> one indicator per level named `column=level`; rows with a
 * missing value dropped or mean/mode imputed; constant columns reported and left out; a two-level
 * categorical binomial response mapped to 0/1 with the mapping in the notes. Expected values are
 * worked out by hand from the small tables below.
 */
import { describe, expect, it } from 'vitest';
import { buildDesign, EngineInputError, fitPath, selectRows } from '../../../server/engine/index';
import type { EngineColumn, EngineTable, FitSpec } from '../../../server/engine/types';

const num = (name: string, values: number[]): EngineColumn => ({ name, kind: 'numeric', values: Float64Array.from(values) });
const cat = (name: string, codes: number[], levels: string[]): EngineColumn => ({ name, kind: 'categorical', codes: Int32Array.from(codes), levels });

const data: EngineTable = {
  nRows: 5,
  columns: [
    num('y', [1, 2, NaN, 4, 5]),
    num('a', [10, NaN, 30, 40, 50]),
    cat('colour', [0, 1, 2, -1, 1], ['red', 'green', 'blue']),
    num('flat', [7, 7, 7, 7, 7]),
  ],
};
const spec = { family: 'gaussian' as const, response: 'y', predictors: ['a', 'colour', 'flat'], missing: 'drop' as const };

describe('buildDesign', () => {
  it('drops rows with missing values and names indicator columns column=level', () => {
    const built = buildDesign(data, spec);
    // Row 3 (missing y), row 2 (missing a) and row 4 (missing colour) go: rows 1 and 5 remain.
    expect([...built.rows]).toEqual([0, 4]);
    expect([...built.y]).toEqual([1, 5]);
    // Over rows 1 and 5: a = 10, 50; colour red, green; blue never appears (constant 0); flat constant.
    expect(built.design.terms).toEqual(['a', 'colour=red', 'colour=green']);
    expect([...built.design.x]).toEqual([10, 50, 1, 0, 0, 1]);
    expect(built.groupsOfTerms).toEqual([-1, 1, 1]);
    expect(built.notes.join('\n')).toContain('"flat" is constant');
    expect(built.notes.join('\n')).toContain('"colour=blue" is constant');
    expect(built.notes.join('\n')).toContain('missing');
  });

  it('sums up many constant columns in one note (an identifier-like categorical over few rows)', () => {
    const nRows = 20;
    const table: EngineTable = {
      nRows,
      columns: [
        { name: 'y', kind: 'numeric', values: Float64Array.from({ length: nRows }, (_, i) => i % 5) },
        { name: 'x', kind: 'numeric', values: Float64Array.from({ length: nRows }, (_, i) => (i * 7) % 11) },
        // Every row its own level; rows 0..7 are dropped (missing x below), so levels 0..7 never occur.
        { name: 'id', kind: 'categorical', codes: Int32Array.from({ length: nRows }, (_, i) => i), levels: Array.from({ length: nRows }, (_, i) => `r${i}`) },
      ],
    };
    (table.columns[1] as { values: Float64Array }).values.fill(Number.NaN, 0, 8);
    const built = buildDesign(table, { response: 'y', predictors: ['x', 'id'], missing: 'drop', family: 'gaussian' });
    const constantNotes = built.notes.filter((note) => note.includes('constant'));
    expect(constantNotes).toEqual([
      '8 columns are constant over the rows used and were left out: "id=r0", "id=r1", "id=r2", "id=r3", "id=r4" and 3 more',
    ]);
  });

  it('rejects a non-finite cell itself, naming the column and the row (fits of built designs do not scan the rows again)', () => {
    const nRows = 12;
    const values = Float64Array.from({ length: nRows }, (_, i) => (i * 7) % 11);
    values[9] = Infinity;
    const table: EngineTable = {
      nRows,
      columns: [
        { name: 'y', kind: 'numeric', values: Float64Array.from({ length: nRows }, (_, i) => i % 5) },
        { name: 'x', kind: 'numeric', values },
      ],
    };
    const build = () => buildDesign(table, { response: 'y', predictors: ['x'], missing: 'drop', family: 'gaussian' });
    expect(build).toThrow(EngineInputError);
    expect(build).toThrow('column "x" has a non-finite value Infinity in row 10');
    // A fill value that overflows (the mean of two huge values) is caught the same way.
    const huge = Float64Array.from({ length: nRows }, (_, i) => (i < 2 ? 1.7e308 : i === 5 ? Number.NaN : 1.7e308));
    const overflowing: EngineTable = { nRows, columns: [table.columns[0], { name: 'z', kind: 'numeric', values: huge }] };
    expect(() => buildDesign(overflowing, { response: 'y', predictors: ['z'], missing: 'impute', family: 'gaussian' })).toThrow('column "z" has a non-finite value Infinity in row 6');
  });

  it('imputes the mean of a numeric column and the most frequent level of a categorical one', () => {
    const built = buildDesign(data, { ...spec, missing: 'impute' });
    expect([...built.rows]).toEqual([0, 1, 3, 4]);
    // a over rows 1, 2, 4, 5 = 10, NaN, 40, 50 -> mean 100/3; colour: red, green, (missing -> green), green.
    const n = 4;
    expect(built.design.terms).toEqual(['a', 'colour=red', 'colour=green']);
    expect(built.design.x[1]).toBeCloseTo(100 / 3, 12);
    // The note rounds the fill value to 6 significant digits (the design keeps it exact).
    expect(built.notes).toContain('column "a": 1 missing value set to the mean 33.3333');
    expect([...built.design.x.subarray(2 * n, 3 * n)]).toEqual([0, 1, 1, 1]);
    const enc = built.encoding.columns.find((c) => c.column === 'colour');
    expect(enc && enc.kind === 'categorical' ? enc.imputeLevel : undefined).toBe('green');
  });

  it('with imputation, keeps a fill value for every predictor, also those without gaps in training', () => {
    const table: EngineTable = {
      nRows: 4,
      columns: [num('y', [1, 2, 3, 5]), num('x', [1, 2, 3, 6]), cat('g', [0, 1, 1, 0], ['a', 'b']), num('z', [2, Number.NaN, 4, 6])],
    };
    const built = buildDesign(table, { response: 'y', predictors: ['x', 'g', 'z'], missing: 'impute', family: 'gaussian' });
    const byName = new Map(built.encoding.columns.map((c) => [c.column, c]));
    const x = byName.get('x');
    expect(x && x.kind === 'numeric' ? x.imputeValue : undefined).toBe(3);
    const g = byName.get('g');
    expect(g && g.kind === 'categorical' ? g.imputeLevel : undefined).toBe('a');
    const z = byName.get('z');
    expect(z && z.kind === 'numeric' ? z.imputeValue : undefined).toBe(4);
    // Only z had gaps: the notes name it alone.
    expect(built.notes.filter((note) => note.includes(' set to the mean'))).toHaveLength(1);
    // Without imputation no fill values are kept (a blank is an error when scoring).
    const dropped = buildDesign(table, { response: 'y', predictors: ['x'], missing: 'drop', family: 'gaussian' });
    const xd = dropped.encoding.columns[0];
    expect(xd.kind === 'numeric' ? xd.imputeValue : 'categorical').toBeUndefined();
  });

  it('maps a two-level categorical binomial response to 0/1 in level order and says so', () => {
    const table: EngineTable = {
      nRows: 6,
      columns: [cat('outcome', [1, 0, 1, 1, 0, 0], ['no', 'yes']), num('x', [1, 2, 3, 4, 5, 6])],
    };
    const built = buildDesign(table, { family: 'binomial', response: 'outcome', predictors: ['x'], missing: 'drop' });
    expect([...built.y]).toEqual([1, 0, 1, 1, 0, 0]);
    expect(built.encoding.responseLevels).toEqual(['no', 'yes']);
    expect(built.notes.join('\n')).toContain('"no" -> 0, "yes" -> 1');
  });

  it('selectRows takes a sub-design (e.g. a fold) row by row', () => {
    const built = buildDesign(data, { ...spec, missing: 'impute' });
    const sub = selectRows(built.design, built.y, [3, 0]);
    expect([...sub.y]).toEqual([5, 1]);
    expect([...sub.design.x.subarray(0, 2)]).toEqual([50, 10]);
  });
});

describe('fitPath on a table', () => {
  it('reports original-scale coefficients that reproduce the standardized ones (b = b~ / sd)', () => {
    const table: EngineTable = {
      nRows: 8,
      columns: [num('y', [3, 1, 4, 1, 5, 9, 2, 6]), num('u', [2, 7, 1, 8, 2, 8, 1, 8]), cat('k', [0, 1, 0, 1, 1, 0, 0, 1], ['p', 'q'])],
    };
    const fitSpec: FitSpec = {
      family: 'gaussian', response: 'y', predictors: ['u', 'k'], penalty: 'lasso', standardize: true, pathLength: 6,
      tolerance: 1e-10, maxIterations: 10000, screening: 'strong', missing: 'drop', cv: null,
    };
    const result = fitPath(table, fitSpec);
    expect(result.terms).toEqual(['u', 'k=p', 'k=q']);
    const scales = result.scales as Float64Array;
    // u: mean 37/8, population sd from the 8 values (worked by hand: sum of squares 251).
    const mean = 37 / 8;
    expect(scales[0]).toBeCloseTo(Math.sqrt(251 / 8 - mean * mean), 12);
    result.coefficients.forEach((coef, k) => {
      for (let j = 0; j < 3; j++) expect(coef[j]).toBeCloseTo(result.standardizedCoefficients[k][j] / scales[j], 12);
    });
    expect(result.encoding?.columns.map((c) => c.column)).toEqual(['u', 'k']);
  });
});

describe('fitPath with the group lasso', () => {
  it('a named group and a categorical predictor enter and leave as wholes (group lasso property)', () => {
    const n = 60;
    const a: number[] = [];
    const b: number[] = [];
    const c: number[] = [];
    const k: number[] = [];
    const y: number[] = [];
    for (let i = 0; i < n; i++) {
      a.push(Math.sin(i));
      b.push(Math.cos(3 * i));
      c.push(Math.sin(7 * i + 1));
      k.push(i % 3);
      y.push(2 * a[i] - b[i] + (k[i] === 2 ? 1.5 : 0) + 0.3 * Math.sin(11 * i));
    }
    const table: EngineTable = {
      nRows: n,
      columns: [num('y', y), num('a', a), num('b', b), num('c', c), cat('k', k, ['l0', 'l1', 'l2'])],
    };
    const result = fitPath(table, {
      family: 'gaussian', response: 'y', predictors: ['a', 'b', 'c', 'k'], penalty: 'group-lasso',
      groups: { ab: ['a', 'b'] }, standardize: true, pathLength: 15, tolerance: 1e-10, maxIterations: 10000,
      screening: 'strong', missing: 'drop', cv: null,
    });
    expect(result.terms).toEqual(['a', 'b', 'c', 'k=l0', 'k=l1', 'k=l2']);
    const together = (coef: Float64Array, members: number[]) => new Set(members.map((j) => coef[j] !== 0)).size === 1;
    result.coefficients.forEach((coef, step) => {
      expect(together(coef, [0, 1]), `group ab at lambda ${result.lambda[step]}`).toBe(true);
      expect(together(coef, [3, 4, 5]), `categorical k at lambda ${result.lambda[step]}`).toBe(true);
    });
    expect(result.nonzero[result.nonzero.length - 1]).toBeGreaterThanOrEqual(5);
  });
});
