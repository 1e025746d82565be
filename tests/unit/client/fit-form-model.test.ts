/** The fit form's own rules: parsing lambdas and weights, and the checks that need the dataset. */
import { describe, expect, it } from 'vitest';
import type { ColumnSchema } from '@shared/datasets';
import { categoricalGroups, datasetIssues, defaultLeftOut, defaultsFromColumns, parseLambdas, parseWeights, rowsKept, unavailableReason } from '@/features/models/components/fitFormModel';

function column(name: string, type: ColumnSchema['type'], distinct: number | null, excluded = false): ColumnSchema {
  return { name, position: 0, type, inferredType: type, reason: '', excluded, overridden: false, summary: { count: 100, missing: 0, distinct } };
}
const columns = [column('y', 'numeric', 90), column('x', 'numeric', 80), column('shift', 'categorical', 3), column('fold', 'numeric', 1), column('id', 'identifier', 100, true)];

describe('fit form rules', () => {
  it('reads a list of lambdas and marks what is not a number', () => {
    expect(parseLambdas('1, 0.5;0.1 2e-3')).toEqual([1, 0.5, 0.1, 0.002]);
    const bad = parseLambdas('1, abc');
    expect(bad[0]).toBe(1);
    expect(Number.isNaN(bad[1])).toBe(true);
  });

  it('reads "column = weight" lines and names the first line it cannot read', () => {
    expect(parseWeights('x = 0\nshift: 2\n')).toEqual({ weights: { x: 0, shift: 2 }, badLine: null });
    expect(parseWeights('x = 0\nshift two').badLine).toBe('shift two');
  });

  it('says why the outcome, the fold column and excluded columns cannot be predictors', () => {
    expect(unavailableReason(columns[0], 'y', null)).toMatch(/outcome/);
    expect(unavailableReason(columns[3], 'y', 'fold')).toMatch(/fold column/);
    expect(unavailableReason(columns[4], 'y', null)).toMatch(/Left out/);
    expect(unavailableReason(columns[1], 'y', null)).toBeNull();
  });

  it('refuses more folds than rows and a fold column with one fold, naming the field', () => {
    expect(datasetIssues({ predictors: ['x'], penalty: 'lasso', cv: { kind: 'folds', folds: 10 } }, columns, 8)).toEqual({ 'cv.folds': '10 folds need at least 10 rows; this version has 8.' });
    expect(datasetIssues({ predictors: ['x'], penalty: 'lasso', cv: { kind: 'folds', folds: 10 } }, columns, 10)).toEqual({});
    expect(datasetIssues({ predictors: ['x'], penalty: 'lasso', cv: { kind: 'column', column: 'fold' } }, columns, 100)['cv.column']).toMatch(/one fold/);
  });

  it('starts the group editor with one group per chosen categorical predictor', () => {
    expect(categoricalGroups(columns, ['x', 'shift'])).toEqual({ shift: ['shift'] });
    expect(categoricalGroups(columns, ['x'])).toEqual({});
  });

  it('leaves the outcome, excluded columns, another model\'s outcome and mostly-blank columns out of the default predictors, saying why', () => {
    const withBlanks = (c: ColumnSchema, missing: number): ColumnSchema => ({ ...c, summary: { ...c.summary, missing } });
    const cols = [...columns, column('grade', 'binary', 2), withBlanks(column('notes', 'categorical', 4), 51), withBlanks(column('z', 'numeric', 90), 20)];
    expect(defaultsFromColumns(cols, 'y', ['grade', 'y']).predictors).toEqual(['x', 'shift', 'fold', 'z']);
    expect(defaultLeftOut(cols, 'y', ['grade'])).toEqual([
      { name: 'grade', reason: 'the outcome of another model on this dataset' },
      { name: 'notes', reason: '51 of 100 cells blank' },
    ]);
  });

  it('counts the rows a fit keeps from the blank counts: exact with one gappy column or gap filling, else a range', () => {
    const withBlanks = (c: ColumnSchema, missing: number): ColumnSchema => ({ ...c, summary: { ...c.summary, missing } });
    const cols = [withBlanks(column('y', 'numeric', 90), 3), withBlanks(column('a', 'numeric', 90), 10), withBlanks(column('b', 'numeric', 90), 40), column('c', 'numeric', 90)];
    expect(rowsKept(cols, 'y', ['c'], 'drop', 100)).toEqual({ least: 97, most: 97 });
    expect(rowsKept(cols, 'y', ['a', 'b', 'c'], 'drop', 100)).toEqual({ least: 47, most: 60 });
    expect(rowsKept(cols, 'y', ['a', 'b', 'c'], 'impute', 100)).toEqual({ least: 97, most: 97 });
  });
});
