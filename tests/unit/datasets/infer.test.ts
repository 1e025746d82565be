/** Type inference on small hand-made columns (expected types and reasons follow the rules in infer.ts). */
import { describe, expect, it } from 'vitest';
import { inferColumn } from '../../../server/datasets/parse/infer';
import { missingTest } from '../../../server/datasets/parse/missing';
import { ColumnProfile } from '../../../server/datasets/parse/profile';

const missing = missingTest(['', 'NA', 'N/A', 'NaN', 'null', '?']);

function infer(name: string, cells: string[]) {
  const p = new ColumnProfile(name);
  cells.forEach((c, i) => p.add(c, i + 1, missing));
  return inferColumn(p);
}

describe('inferColumn', () => {
  it('numbers, with missing markers in any case and blanks', () => {
    expect(infer('x', ['1.5', ' 2 ', 'na', 'NULL', '-3e2', '?', '4'])).toMatchObject({ type: 'numeric', excluded: false, storage: 'float64' });
  });
  it('0/1 and yes/no are binary', () => {
    expect(infer('y', ['0', '1', '1', '0.0'])).toMatchObject({ type: 'binary', storage: 'float64' });
    expect(infer('y', ['yes', 'no', 'no'])).toMatchObject({ type: 'binary', storage: 'codes' });
  });
  it('a row counter and an id-named key are identifiers, excluded', () => {
    expect(infer('n', ['1', '2', '3', '4'])).toMatchObject({ type: 'identifier', excluded: true });
    expect(infer('customer_id', ['907', '15', '233', '4'])).toMatchObject({ type: 'identifier', excluded: true });
    // Years increase too but do not count rows: a predictor, not an identifier.
    expect(infer('year', ['1947', '1948', '1949', '1950'])).toMatchObject({ type: 'numeric' });
  });
  it('few text levels are categorical; the reason names the first non-number and its row', () => {
    const r = infer('colour', ['1', 'red', 'green', 'red', 'blue', 'green']);
    expect(r.type).toBe('categorical');
    expect(r.reason).toMatch(/"red" in row 3 \(the header is row 1\) is not a number/);
  });
  it('all-distinct short strings are identifiers; long sentences are free text', () => {
    expect(infer('code', ['A1', 'B2', 'C3', 'D4', 'E5'])).toMatchObject({ type: 'identifier', excluded: true });
    const sentences = Array.from({ length: 8 }, (_, i) => `this is a rather long comment number ${i} about the row`);
    expect(infer('comment', sentences)).toMatchObject({ type: 'text', excluded: true });
  });
  it('a column with nothing in it is excluded with that reason', () => {
    expect(infer('empty', ['', 'NA', ''])).toMatchObject({ excluded: true, reason: 'Every value is missing.' });
  });
});
