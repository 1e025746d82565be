/**
 * A fit end to end through the API and an in-process worker: queued, run, results stored; the same
 * spec on the same dataset version gives bitwise-identical results; cancel; choose lambda; the
 * version list with key metrics and the spec changes of version 2.
 */
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UploadResultDto } from '../../../shared/datasets';
import type { FitDetailDto, FitRequestInput } from '../../../shared/fits';
import type { ModelDetailDto, ModelListItemDto } from '../../../shared/models';
import { fits } from '../../../server/db/schema/index';
import { signUp, type Session } from '../../support/session';
import { apiBase } from '../datasets/support';
import { closeFitsApp, createModel, post, regressionCsv, runFit, startFitsApp, uploadCsv, waitForFit, type FitsApp } from './support';

let t: FitsApp;
let alice: Session;
let data: UploadResultDto;
let model: ModelListItemDto;

const spec: FitRequestInput = {
  predictors: ['x1', 'x2', 'n1', 'n2', 'n3', 'g'],
  penalty: 'elastic-net',
  l1Share: 0.7,
  path: { kind: 'automatic', pathLength: 30 },
  cv: { kind: 'folds', folds: 4, seed: 11 },
};

beforeAll(async () => {
  t = await startFitsApp();
  alice = await signUp(t.app);
  data = await uploadCsv(alice, regressionCsv(300, 3), 'Vats');
  model = await createModel(alice, { name: 'Yield', datasetId: data.datasetId, outcome: 'y', family: 'gaussian' });
});
afterAll(async () => closeFitsApp(t));

describe('running a fit', () => {
  let first: FitDetailDto;

  it('queues, runs and stores a cross-validated elastic-net fit', async () => {
    const queued = await runFit(alice, model.id, spec);
    expect(queued.version).toBe(1);
    expect(['waiting', 'running']).toContain(queued.status);
    first = await waitForFit(alice, queued.id);
    expect(first.status, first.message ?? '').toBe('finished');
    const r = first.results!;
    expect(r.lambda.length).toBe(30);
    expect(r.certificates).toHaveLength(30);
    expect(r.cv!.folds).toBe(4);
    expect(r.cv!.mean).toHaveLength(30);
    expect(r.chosen.rule).toBe('one-standard-error');
    expect(r.chosen.index).toBe(r.cv!.oneStandardError.index);
    // x1 and x2 carry the signal: kept at the chosen lambda, in every fold.
    const kept = new Set(r.coefficients[r.chosen.index].terms.map((j) => r.terms[j]));
    expect(kept.has('x1') && kept.has('x2')).toBe(true);
    expect(r.stability![r.terms.indexOf('x1')]).toBe(1);
    expect(r.evaluation.state).toBe('ready');
    expect(r.evaluation.refit!.coefficients.map((c) => c.term)).toContain('x1');
    expect(r.evaluation.refit!.caution.length).toBeGreaterThan(20);
    const d = r.evaluation.diagnostics!;
    if (d.family !== 'gaussian') throw new Error('gaussian diagnostics expected');
    expect(d.rSquared).toBeGreaterThan(0.8);
    expect(first.progress.fraction).toBe(1);
    expect(first.engineVersion).toMatch(/\+[0-9a-f]{12}$/);
    expect(first.datasetVersion.sha256).toBe(data.version.sha256);
  });

  it('re-running the same spec on the same dataset version gives bitwise-identical results', async () => {
    const again = await waitForFit(alice, (await runFit(alice, model.id, spec)).id);
    expect(again.version).toBe(2);
    expect(again.specChanges).toEqual([]);
    const [a, b] = await Promise.all(
      [first.id, again.id].map(async (id) => (await t.ctx.db.select().from(fits).where(eq(fits.id, id)))[0]),
    );
    expect(Buffer.compare(a.coefficients!, b.coefficients!)).toBe(0);
    expect(Buffer.compare(a.standardizedCoefficients!, b.standardizedCoefficients!)).toBe(0);
    expect(Buffer.compare(a.selectionCounts!, b.selectionCounts!)).toBe(0);
    // Every CV number identical (Object.is distinguishes -0 and NaN too).
    const ca = a.results!.cv!;
    const cb = b.results!.cv!;
    expect(ca.mean.every((v, i) => Object.is(v, cb.mean[i]))).toBe(true);
    expect(ca.standardError.every((v, i) => Object.is(v, cb.standardError[i]))).toBe(true);
    expect(a.results!.intercept.every((v, i) => Object.is(v, b.results!.intercept[i]))).toBe(true);
  });

  it('a changed spec is version 3 and lists what changed; the model lists its versions with metrics', async () => {
    const v3 = await waitForFit(alice, (await runFit(alice, model.id, { ...spec, predictors: ['x1', 'x2', 'n1'], l1Share: 1 })).id);
    expect(v3.version).toBe(3);
    const fields = v3.specChanges!.map((c) => c.field).sort();
    expect(fields).toEqual(['l1Share', 'predictors']);
    expect(v3.specChanges!.find((c) => c.field === 'predictors')!.summary).toMatch(/removed n2, n3, g/);
    const detail = (await alice.agent.get(`${apiBase(alice)}/models/${model.id}`)).body as ModelDetailDto;
    expect(detail.versions.map((v) => v.version)).toEqual([3, 2, 1]);
    for (const v of detail.versions) {
      expect(v.status).toBe('finished');
      expect(v.metrics.nonzero).toBeGreaterThan(0);
      expect(v.metrics.cvError).toBeGreaterThan(0);
    }
    const list = (await alice.agent.get(`${apiBase(alice)}/models`)).body as ModelListItemDto[];
    expect(list.find((m) => m.id === model.id)!.latest!.version).toBe(3);
    expect(list.find((m) => m.id === model.id)!.versionCount).toBe(3);
  });

  it('a finished version is immutable in the database: its spec and results cannot change, only the choice', async () => {
    await expect(t.ctx.db.update(fits).set({ seed: 99 }).where(eq(fits.id, first.id))).rejects.toMatchObject({ cause: { message: expect.stringMatching(/immutable/) } });
    await expect(t.ctx.db.update(fits).set({ unconverged: true }).where(eq(fits.id, first.id))).rejects.toMatchObject({ cause: { message: expect.stringMatching(/only the chosen lambda may change/) } });
    await expect(t.ctx.db.update(fits).set({ chosenIndex: 1, chosenRule: 'manual' }).where(eq(fits.id, first.id))).resolves.toBeDefined();
  });

  it('choosing a lambda: a rule or any index; the refit follows; out-of-range is refused', async () => {
    const min = await post(alice, `/fits/${first.id}/choice`, { rule: 'minimum' });
    expect(min.status, JSON.stringify(min.body)).toBe(200);
    expect((min.body as FitDetailDto).results!.chosen.index).toBe(first.results!.cv!.minimum.index);
    const manual = await post(alice, `/fits/${first.id}/choice`, { index: 3 });
    expect((manual.body as FitDetailDto).results!.chosen).toMatchObject({ index: 3, rule: 'manual' });
    const ready = await waitForFit(alice, first.id, (f) => f.results!.evaluation.state !== 'waiting');
    expect(ready.results!.evaluation.state).toBe('ready');
    const kept = ready.results!.coefficients[3].terms.length;
    expect(ready.results!.evaluation.refit?.coefficients.length ?? 0).toBe(kept);
    const bad = await post(alice, `/fits/${first.id}/choice`, { index: 30 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('index');
  });

  it('cancels a running fit; its workers stop and it stays cancelled', async () => {
    const big = await uploadCsv(alice, regressionCsv(3000, 150, 3), 'Wide');
    const m = await createModel(alice, { name: 'Wide', datasetId: big.datasetId, outcome: 'y', family: 'gaussian' });
    const queued = await runFit(alice, m.id, { predictors: ['x1', 'x2', ...Array.from({ length: 150 }, (_, k) => `n${k + 1}`)], penalty: 'lasso', path: { kind: 'automatic', pathLength: 200, pathDecades: 5 }, tolerance: 1e-12, cv: { kind: 'folds', folds: 10, seed: 1 } });
    await waitForFit(alice, queued.id, (f) => f.status === 'running');
    const res = await post(alice, `/fits/${queued.id}/cancel`, {});
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect((res.body as FitDetailDto).status).toBe('cancelled');
    await new Promise((r) => setTimeout(r, 1500));
    const after = (await alice.agent.get(`${apiBase(alice)}/fits/${queued.id}`)).body as FitDetailDto;
    expect(after.status).toBe('cancelled');
    expect(after.message).toMatch(/^This fit was cancelled by .+\.$/);
    expect(after.results).toBeNull();
    const again = await post(alice, `/fits/${queued.id}/cancel`, {});
    expect(again.status).toBe(409);
  });

  it('a solve that hits its iteration limit is flagged, never shown as a plain success', async () => {
    // The group lasso has no exact finishing step, so 10 iterations cannot reach a 1e-14 gap.
    const { l1Share: _mix, ...rest } = spec;
    const fit = await waitForFit(alice, (await runFit(alice, model.id, { ...rest, penalty: 'group-lasso', maxIterations: 10, tolerance: 1e-14 })).id);
    expect(fit.status).toBe('finished');
    expect(fit.unconverged).toBe(true);
    expect(fit.message).toMatch(/iteration limit/);
    const r = fit.results!;
    expect(r.unconvergedLambdas.length).toBeGreaterThan(0);
    for (const l of r.unconvergedLambdas) expect(r.certificates[l].status).toBe('iteration-limit');
    expect(r.certificates[r.unconvergedLambdas[0]].gap).toBeGreaterThan(1e-14);
  });

  it('a failure found by the engine is recorded with its message (fold ids that are not whole numbers)', async () => {
    const fit = await waitForFit(alice, (await runFit(alice, model.id, { ...spec, predictors: ['x1', 'x2', 'g'], cv: { kind: 'column', column: 'n3' } })).id);
    expect(fit.status).toBe('failed');
    expect(fit.message).toMatch(/fold column "n3" has -?[0-9.]+ in row \d+; fold ids are whole numbers/);
    expect(fit.results).toBeNull();
  });

  it('a holdout split: the chosen lambda is scored on rows the fit never saw; maxTerms ends the path', async () => {
    const fit = await waitForFit(alice, (await runFit(alice, model.id, { ...spec, holdout: { share: 0.2, seed: 4 }, path: { kind: 'automatic', pathLength: 30, maxTerms: 3 } })).id);
    expect(fit.status, fit.message ?? '').toBe('finished');
    const r = fit.results!;
    expect(r.rowsFitted).toBe(240);
    const h = r.evaluation.holdout!;
    expect(h.rowCount).toBe(60);
    expect(h.metrics.find((m) => m.name === 'rSquared')!.value).toBeGreaterThan(0.5);
    expect(r.evaluation.diagnostics!.rows).toBe('holdout');
    // The path stops after the first lambda with more than 3 terms.
    const last = r.nonzero.length - 1;
    expect(r.nonzero[last]).toBeGreaterThan(3);
    expect(r.nonzero.slice(0, last).every((k) => k <= 3)).toBe(true);
  });
});
