/**
 * Pure pieces of the fits server: the spec adapter (shared names -> engine names), the spec diff,
 * the progress estimate, row-wise prediction with per-row errors, the holdout split and the byte codec.
 * Expected values follow from the small inputs written here.
 */
import { describe, expect, it } from 'vitest';
import { fitRequestSchema, type FitSpec } from '../../../shared/fits';
import { parseCsvText } from '../../../server/tabular/csv';
import { bytesToFloat64, bytesToUint8, float64ToBytes, uint8ToBytes } from '../../../server/fits/codec';
import { predictRowsWithErrors } from '../../../server/fits/compute/predict-rows';
import { splitHoldout } from '../../../server/fits/compute/table';
import { engineSpec } from '../../../server/fits/engine-spec';
import type { FitSummaryRow } from '../../../server/fits/data';
import { progressDto } from '../../../server/fits/service/dto';
import { specChanges } from '../../../server/fits/service/spec-diff';

function spec(extra: object): FitSpec {
  return { ...fitRequestSchema.parse({ predictors: ['a', 'b'], penalty: 'lasso', ...extra }), datasetVersionId: 'v', outcome: 'y', family: 'gaussian' };
}

describe('fit request schema', () => {
  it('requires the L1 share for elastic net and refuses it elsewhere', () => {
    const missing = fitRequestSchema.safeParse({ predictors: ['a'], penalty: 'elastic-net' });
    expect(missing.success).toBe(false);
    expect(missing.error!.issues[0].path).toEqual(['l1Share']);
    const extra = fitRequestSchema.safeParse({ predictors: ['a'], penalty: 'lasso', l1Share: 0.5 });
    expect(extra.error!.issues[0].path).toEqual(['l1Share']);
  });
  it('refuses explicit lambdas out of order and a group naming a non-predictor', () => {
    expect(fitRequestSchema.safeParse({ predictors: ['a'], penalty: 'lasso', path: { kind: 'explicit', lambdas: [0.1, 0.2] } }).success).toBe(false);
    const g = fitRequestSchema.safeParse({ predictors: ['a'], penalty: 'group-lasso', groups: { one: ['a', 'z'] } });
    expect(g.error!.issues[0].path).toEqual(['groups', 'one']);
  });
});

describe('engine spec adapter', () => {
  it('maps the nested API spec onto the engine (l1Share, pathDecades, maxTerms, penaltyWeights, cv)', () => {
    const e = engineSpec(spec({ penalty: 'elastic-net', l1Share: 0.25, path: { kind: 'automatic', pathLength: 40, pathDecades: 3, maxTerms: 7 }, penaltyWeights: { a: 0 }, cv: { kind: 'folds', folds: 5, seed: 9 } }));
    expect(e.l1Share).toBe(0.25);
    expect(e.pathLength).toBe(40);
    expect(e.pathDecades).toBe(3);
    expect(e.maxTerms).toBe(7);
    expect(e.penaltyWeights).toEqual({ a: 0 });
    expect(e.cv).toEqual({ folds: 5, seed: 9 });
    expect(e.response).toBe('y');
    const explicit = engineSpec(spec({ path: { kind: 'explicit', lambdas: [1, 0.5] }, cv: { kind: 'column', column: 'f' } }));
    expect(explicit.lambda).toEqual([1, 0.5]);
    expect(explicit.pathLength).toBe(2);
    expect(explicit.cv?.foldColumn).toBe('f');
    expect(explicit.l1Share).toBeUndefined();
    expect(explicit.maxTerms).toBeUndefined();
  });
});

describe('spec changes', () => {
  it('lists changed fields only, predictors as added and removed', () => {
    const before = spec({ predictors: ['a', 'b', 'c'] });
    const after = { ...spec({ predictors: ['a', 'd'], standardize: false }) };
    const changes = specChanges(before, after);
    expect(changes.map((c) => c.field)).toEqual(['predictors', 'standardize']);
    expect(changes[0].summary).toBe('Predictors: added d; removed b, c.');
    expect(specChanges(before, { ...before })).toEqual([]);
  });

  it("names a changed field in the page's words, not by its key", () => {
    const before = spec({ penalty: 'elastic-net', l1Share: 0.8 });
    const [change] = specChanges(before, { ...before, l1Share: 0.5 });
    expect(change.field).toBe('l1Share');
    expect(change.summary).toBe('L1 share: 0.8 → 0.5.');
    expect(specChanges(before, { ...before, maxIterations: 500 })[0].summary).toMatch(/^Iteration limit: /);
  });
  it('describes object fields in plain words, not JSON', () => {
    const before = spec({ cv: { kind: 'folds', folds: 5, seed: 1 } });
    const summaries = specChanges(before, { ...before, cv: { kind: 'folds', folds: 10, seed: 1 }, path: { kind: 'explicit', lambdas: [1, 0.5] }, holdout: { share: 0.2, seed: 3 } }).map((c) => c.summary);
    expect(summaries).toContain('Cross-validation: 5 folds, seed 1 → 10 folds, seed 1.');
    expect(summaries).toContain('Holdout: none → 20% of the rows, seed 3.');
    expect(summaries.find((s) => s.startsWith('Path:'))).toMatch(/→ 2 listed lambdas \(1, 0\.5\)\.$/);
    for (const s of summaries) expect(s).not.toMatch(/[{}"]/);
  });
});

describe('progress', () => {
  const row = (over: Partial<FitSummaryRow>) =>
    ({ id: 'f', status: 'running', startedAt: new Date(1_000), finishedAt: null, message: null, progress: { stage: 'folds', lambdaIndex: 50, lambdaCount: 50, foldsDone: 4, foldsTotal: 9 }, ...over }) as FitSummaryRow;
  it('counts the path as one share and each fold as one more; the time left scales the elapsed time', () => {
    const p = progressDto(row({}), 11_000);
    expect(p.fraction).toBeCloseTo(0.5, 12);
    expect(p.elapsedMs).toBe(10_000);
    expect(p.remainingMs).toBe(10_000);
  });
  it('knows nothing about the time left before any work is done', () => {
    const p = progressDto(row({ progress: { stage: 'path', lambdaIndex: 0, lambdaCount: null, foldsDone: 0, foldsTotal: 9 } }), 2_000);
    expect(p.fraction).toBe(0);
    expect(p.remainingMs).toBeNull();
  });
});

describe('row-wise prediction', () => {
  const encoding = {
    columns: [
      { column: 'x', kind: 'numeric' as const, term: 0 },
      { column: 'g', kind: 'categorical' as const, levels: ['a', 'b'], terms: [1, 2] },
    ],
  };
  it('scores good rows and names the problem of each bad one', () => {
    const table = parseCsvText('x,g\n2,a\n,b\nzz,a\n1,c\n', 't.csv');
    const out = predictRowsWithErrors(table, { family: 'binomial', encoding, intercept: 0.5, coefficients: [2, 0, -1] });
    expect(out.linearPredictor[0]).toBe(4.5);
    expect(out.probability![0]).toBeCloseTo(1 / (1 + Math.exp(-4.5)), 14);
    expect(out.errors).toEqual([null, 'column "x" is blank (this fit left out rows with blanks, so it has no fill value)', 'column "x": "zz" is not a number', 'column "g": category "c" was not seen when fitting']);
    expect(Number.isNaN(out.linearPredictor[1])).toBe(true);
  });
  it('fills a gap with the stored imputation value', () => {
    const table = parseCsvText('x,g\n,b\n', 't.csv');
    const filled = { column: 'x', kind: 'numeric' as const, term: 0, imputeValue: 3 };
    const out = predictRowsWithErrors(table, { family: 'gaussian', encoding: { columns: [filled, encoding.columns[1]] }, intercept: 0, coefficients: [2, 0, -1] });
    expect(out.errors).toEqual([null]);
    expect(out.linearPredictor[0]).toBe(5);
  });
});

describe('holdout split and codec', () => {
  it('holds out round(share * n) rows, the same ones for the same seed, in table order', () => {
    const table = parseCsvText(`v\n${Array.from({ length: 10 }, (_, i) => i).join('\n')}\n`, 't.csv');
    const a = splitHoldout(table, { share: 0.3, seed: 5 });
    const b = splitHoldout(table, { share: 0.3, seed: 5 });
    expect(a.holdout!.nRows).toBe(3);
    expect(a.train.nRows).toBe(7);
    expect(Array.from(a.holdoutRows!)).toEqual(Array.from(b.holdoutRows!));
    const rows = Array.from(a.holdoutRows!);
    expect(rows).toEqual([...rows].sort((x, y) => x - y));
    expect(splitHoldout(table, undefined).holdout).toBeNull();
  });
  it('round-trips Float64Array and Uint8Array through bytes exactly', () => {
    const values = Float64Array.from([0, -0, 1.5, Number.NaN, -1e-300, Number.MAX_VALUE]);
    const back = bytesToFloat64(float64ToBytes(values.subarray(1)));
    expect(Array.from(back).every((v, i) => Object.is(v, values[i + 1]))).toBe(true);
    expect(Array.from(bytesToUint8(uint8ToBytes(Uint8Array.from([0, 7, 255]))))).toEqual([0, 7, 255]);
  });
});
