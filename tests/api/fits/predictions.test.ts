/**
 * Applying a finished fit to a table: a dataset version or an uploaded CSV gives one CSV line per row,
 * the linear predictor (and probability for binomial) or the row's error: a missing value, an unseen
 * category, text where a number belongs. A column missing from the table entirely is a 422 naming it.
 * Expected numbers are recomputed here from the fit's own coefficients.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UploadResultDto } from '../../../shared/datasets';
import type { FitDetailDto } from '../../../shared/fits';
import { signUp, withCsrf, type Session } from '../../support/session';
import { apiBase } from '../datasets/support';
import { closeFitsApp, createModel, regressionCsv, runFit, startFitsApp, uploadCsv, waitForFit, type FitsApp } from './support';

let t: FitsApp;
let alice: Session;
let data: UploadResultDto;
let gaussian: FitDetailDto;
let binomial: FitDetailDto;

const close = (a: number, b: number, tol = 1e-9) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(a), Math.abs(b));

/** b0 + x'b from the fit's detail at its chosen lambda, for one row of named values. */
function linearPredictor(fit: FitDetailDto, row: Record<string, string>): number {
  const r = fit.results!;
  const k = r.chosen.index;
  let eta = r.intercept[k];
  r.coefficients[k].terms.forEach((j, i) => {
    const term = r.terms[j];
    const eq = term.indexOf('=');
    if (eq > 0) eta += row[term.slice(0, eq)] === term.slice(eq + 1) ? r.coefficients[k].values[i] : 0;
    else eta += Number(row[term]) * r.coefficients[k].values[i];
  });
  return eta;
}

function parseCsv(text: string): Record<string, string>[] {
  const lines = text.trim().split('\n').filter((l) => !l.startsWith('#'));
  const header = lines[0].split(',');
  return lines.slice(1).map((line) => {
    // The error column may be quoted and contain commas.
    const cells = line.match(/("([^"]|"")*"|[^,]*)(,|$)/g)!.map((c) => c.replace(/,$/, '').replace(/^"|"$/g, '').replace(/""/g, '"'));
    return Object.fromEntries(header.map((h, i) => [h, cells[i] ?? '']));
  });
}

beforeAll(async () => {
  t = await startFitsApp();
  alice = await signUp(t.app);
  data = await uploadCsv(alice, regressionCsv(150, 2), 'Apply');
  const g = await createModel(alice, { name: 'Apply y', datasetId: data.datasetId, outcome: 'y', family: 'gaussian' });
  const b = await createModel(alice, { name: 'Apply yes', datasetId: data.datasetId, outcome: 'yes', family: 'binomial' });
  const spec = { predictors: ['x1', 'x2', 'n1', 'g'], penalty: 'lasso' as const, path: { kind: 'automatic' as const, pathLength: 15 }, cv: { kind: 'folds' as const, folds: 3, seed: 5 } };
  [gaussian, binomial] = await Promise.all([runFit(alice, g.id, spec), runFit(alice, b.id, { ...spec, metric: 'auc' })].map(async (p) => waitForFit(alice, (await p).id)));
  expect(gaussian.status).toBe('finished');
  expect(binomial.status, binomial.message ?? '').toBe('finished');
});
afterAll(async () => closeFitsApp(t));

const upload = (fit: FitDetailDto, csv: string) =>
  withCsrf(alice.agent.post(`${apiBase(alice)}/fits/${fit.id}/predictions`), alice.csrf).attach('file', Buffer.from(csv), 'new-rows.csv');

describe('a binomial fit chosen by AUC', () => {
  it('chooses the lambda with the highest mean AUC (higher is better for AUC); diagnostics give ROC and calibration', () => {
    const cv = binomial.results!.cv!;
    expect(cv.metric).toBe('auc');
    const best = Math.max(...cv.mean.filter((v) => !Number.isNaN(v)));
    expect(cv.mean[cv.minimum.index]).toBe(best);
    expect(cv.mean.indexOf(best)).toBe(cv.minimum.index);
    const d = binomial.results!.evaluation.diagnostics!;
    if (d.family !== 'binomial') throw new Error('binomial diagnostics expected');
    expect(d.roc[0]).toMatchObject({ falsePositiveRate: 0, truePositiveRate: 0 });
    expect(d.roc[d.roc.length - 1]).toMatchObject({ falsePositiveRate: 1, truePositiveRate: 1 });
    expect(d.auc).toBeGreaterThan(0.8);
    expect(d.calibration.reduce((n, b) => n + b.count, 0)).toBe(d.rowCount);
    expect(d.positiveClass).toBe('yes');
    // The confusion table names both levels, not "not yes".
    expect(d.negativeClass).toBe('no');
  });
});

describe('predictions', () => {
  it('a dataset version: one line per row, equal to b0 + x\'b at the chosen lambda', async () => {
    const res = await alice.agent.get(`${apiBase(alice)}/fits/${gaussian.id}/predictions?datasetVersionId=${data.version.id}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    expect(res.headers['x-lariat-row-errors']).toBe('0');
    const rows = parseCsv(res.text);
    expect(rows).toHaveLength(150);
    const source = parseCsv(regressionCsv(150, 2));
    for (const i of [0, 17, 149]) expect(close(Number(rows[i].linear_predictor), linearPredictor(gaussian, source[i]))).toBe(true);
    expect(res.text).toMatch(/# Selected is not causal/);
  });

  it('an uploaded CSV: per-row errors for a missing value, an unseen category and a non-number; good rows scored (binomial: probability)', async () => {
    const csv = ['x1,x2,n1,g', '0.5,-1,0.2,red', ',1,0.1,blue', '1,2,0.3,purple', '1,abc,0.3,green', '-0.25,0.75,0,"green"'].join('\n');
    const res = await upload(binomial, csv);
    expect(res.status, res.text).toBe(200);
    expect(res.headers['x-lariat-row-errors']).toBe('3');
    const rows = parseCsv(res.text);
    expect(rows.map((r) => r.row)).toEqual(['1', '2', '3', '4', '5']);
    const needed = new Set(binomial.results!.coefficients[binomial.results!.chosen.index].terms.map((j) => binomial.results!.terms[j].split('=')[0]));
    // Row 2 lacks x1: an error only if the fit uses x1 (it carries the signal, so it does).
    expect(needed.has('x1')).toBe(true);
    expect(rows[1].error).toBe('column "x1" is blank (this fit left out rows with blanks, so it has no fill value)');
    expect(rows[2].error).toMatch(/column "g": category "purple" was not seen when fitting/);
    expect(rows[3].error).toMatch(/column "x2": "abc" is not a number/);
    for (const i of [0, 4]) {
      expect(rows[i].error).toBe('');
      const eta = linearPredictor(binomial, { x1: ['0.5', '-0.25'][i / 4], x2: ['-1', '0.75'][i / 4], n1: ['0.2', '0'][i / 4], g: ['red', 'green'][i / 4] });
      expect(close(Number(rows[i].linear_predictor), eta)).toBe(true);
      expect(close(Number(rows[i].probability), 1 / (1 + Math.exp(-eta)))).toBe(true);
    }
  });

  it('a table without a column the fit uses: 422 naming the column', async () => {
    const res = await upload(gaussian, 'x1,n1,g\n1,2,red\n');
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('x2');
    expect(res.body.error.message).toMatch(/no column "x2"/);
  });
});
