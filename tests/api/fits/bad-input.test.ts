/**
 * Bad fit requests are refused before anything is stored or queued, each with a 400 naming the field.
 */
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UploadResultDto } from '../../../shared/datasets';
import type { FitRequestInput } from '../../../shared/fits';
import type { ModelListItemDto } from '../../../shared/models';
import { signUp, withCsrf, type Session } from '../../support/session';
import { apiBase } from '../datasets/support';
import { closeFitsApp, createModel, post, regressionCsv, startFitsApp, uploadCsv, type FitsApp } from './support';

let t: FitsApp;
let alice: Session;
let data: UploadResultDto;
let model: ModelListItemDto;
let v2Id: string;

async function stored(): Promise<{ fits: number; jobs: number }> {
  const f = await t.ctx.db.execute(sql`SELECT count(*)::int AS n FROM fits`);
  const j = await t.ctx.db.execute(sql`SELECT count(*)::int AS n FROM pgboss.job`);
  return { fits: (f.rows[0] as { n: number }).n, jobs: (j.rows[0] as { n: number }).n };
}

beforeAll(async () => {
  t = await startFitsApp({ inProcessWorker: false });
  alice = await signUp(t.app);
  // A column with one fold id, and x3 to be excluded.
  const csv = regressionCsv(40, 3)
    .trim()
    .split('\n')
    .map((line, i) => `${line},${i === 0 ? 'onefold' : '1'}`)
    .join('\n');
  data = await uploadCsv(alice, `${csv}\n`, 'Bad');
  model = await createModel(alice, { name: 'Bad input', datasetId: data.datasetId, outcome: 'y', family: 'gaussian' });
  const settings = await withCsrf(alice.agent.post(`${apiBase(alice)}/datasets/${data.datasetId}/versions/1/column-settings`), alice.csrf).send({
    columns: [{ name: 'n3', type: 'numeric', excluded: true }],
  });
  expect(settings.status, JSON.stringify(settings.body)).toBe(201);
  v2Id = (settings.body as { version: { id: string } }).version?.id ?? (settings.body as { id: string }).id;
});
afterAll(async () => closeFitsApp(t));

const good: FitRequestInput = { predictors: ['x1', 'x2'], penalty: 'lasso', cv: { kind: 'folds', folds: 5, seed: 1 } };

const cases: { name: string; body: () => object; field: string; message: RegExp }[] = [
  { name: 'an excluded column', body: () => ({ ...good, predictors: ['x1', 'n3'] }), field: 'predictors', message: /"n3" is excluded/ },
  { name: 'a missing column', body: () => ({ ...good, predictors: ['x1', 'nope'] }), field: 'predictors', message: /"nope" is not a column/ },
  { name: 'an empty predictor set', body: () => ({ ...good, predictors: [] }), field: 'predictors', message: /at least one predictor/ },
  { name: 'a fold column with one fold', body: () => ({ ...good, cv: { kind: 'column', column: 'onefold' } }), field: 'cv.column', message: /one fold/ },
  { name: 'a replaced dataset version', body: () => ({ ...good, datasetVersionId: data.version.id }), field: 'datasetVersionId', message: /was replaced by version 2/ },
  { name: 'more folds than rows', body: () => ({ ...good, cv: { kind: 'folds', folds: 41, seed: 1 }, }), field: 'cv', message: /At most 50|41 folds need at least 41 rows/ },
  { name: 'elastic net without its L1 share', body: () => ({ ...good, penalty: 'elastic-net' }), field: 'l1Share', message: /L1 share/ },
  { name: 'a binomial metric for a gaussian model', body: () => ({ ...good, metric: 'auc' }), field: 'metric', message: /gaussian/ },
  { name: 'the outcome as a predictor', body: () => ({ ...good, predictors: ['x1', 'y'] }), field: 'predictors', message: /is the outcome/ },
];

describe('bad fit requests', () => {
  for (const c of cases) {
    it(`refuses ${c.name} with a 400 naming ${c.field}, storing and queueing nothing`, async () => {
      const before = await stored();
      const res = await post(alice, `/models/${model.id}/fits`, c.body());
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(res.body.error.field).toContain(c.field);
      expect(res.body.error.message).toMatch(c.message);
      expect(await stored()).toEqual(before);
    });
  }

  it('refuses more folds than rows on a small table (cv.folds)', async () => {
    const small = await uploadCsv(alice, regressionCsv(6, 1), 'Small');
    const m = await createModel(alice, { name: 'Small', datasetId: small.datasetId, outcome: 'y', family: 'gaussian' });
    const res = await post(alice, `/models/${m.id}/fits`, { ...good, cv: { kind: 'folds', folds: 10, seed: 1 } });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('cv.folds');
    expect(res.body.error.message).toMatch(/10 folds need at least 10 rows; the fit has 6/);
  });

  it('refuses a binomial model whose outcome has more than two values (outcome)', async () => {
    const res = await post(alice, '/models', { name: 'Three', datasetId: data.datasetId, outcome: 'g', family: 'binomial' });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('outcome');
    expect(res.body.error.message).toMatch(/two values; "g" has 3/);
  });

  it('accepts the good request on the latest version (control)', async () => {
    const res = await post(alice, `/models/${model.id}/fits`, { ...good, datasetVersionId: v2Id });
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    expect(res.body.version).toBe(1);
  });
});
