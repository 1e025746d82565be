/**
 * Who may do what with models and fits: admins and analysts run, cancel and choose; reviewers and
 * viewers read only (403); another workspace sees nothing (404); a stranger gets 401; a state-changing
 * request without the CSRF header is refused.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UploadResultDto } from '../../../shared/datasets';
import type { FitDetailDto, FitRequestInput } from '../../../shared/fits';
import type { ModelListItemDto } from '../../../shared/models';
import { inviteAndJoin, signUp, uniqueEmail, type Session } from '../../support/session';
import { apiBase } from '../datasets/support';
import { closeFitsApp, createModel, post, regressionCsv, runFit, startFitsApp, uploadCsv, waitForFit, type FitsApp } from './support';

let t: FitsApp;
let admin: Session;
let analyst: Session;
let reviewer: Session;
let viewer: Session;
let outsider: Session;
let data: UploadResultDto;
let model: ModelListItemDto;
let fit: FitDetailDto;

const spec: FitRequestInput = { predictors: ['x1', 'x2', 'g'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 2 } };

beforeAll(async () => {
  t = await startFitsApp();
  admin = await signUp(t.app);
  analyst = await inviteAndJoin(t, admin, uniqueEmail('analyst'), 'analyst');
  reviewer = await inviteAndJoin(t, admin, uniqueEmail('reviewer'), 'reviewer');
  viewer = await inviteAndJoin(t, admin, uniqueEmail('viewer'), 'viewer');
  outsider = await signUp(t.app);
  data = await uploadCsv(admin, regressionCsv(120, 2), 'Access');
  model = await createModel(analyst, { name: 'Access', datasetId: data.datasetId, outcome: 'y', family: 'gaussian' });
  fit = await waitForFit(analyst, (await runFit(analyst, model.id, spec)).id);
  expect(fit.status).toBe('finished');
});
afterAll(async () => closeFitsApp(t));

describe('roles', () => {
  for (const role of ['reviewer', 'viewer'] as const) {
    it(`a ${role} reads models and fits but cannot create, run, cancel or choose (403)`, async () => {
      const s = role === 'reviewer' ? reviewer : viewer;
      expect((await s.agent.get(`${apiBase(s)}/models`)).status).toBe(200);
      expect((await s.agent.get(`${apiBase(s)}/models/${model.id}`)).status).toBe(200);
      expect((await s.agent.get(`${apiBase(s)}/fits/${fit.id}`)).status).toBe(200);
      expect((await s.agent.get(`${apiBase(s)}/fits/${fit.id}/progress`)).status).toBe(200);
      expect((await s.agent.get(`${apiBase(s)}/fits/${fit.id}/predictions?datasetVersionId=${data.version.id}`)).status).toBe(200);
      expect((await post(s, '/models', { name: `By ${role}`, datasetId: data.datasetId, outcome: 'y', family: 'gaussian' })).status).toBe(403);
      expect((await post(s, `/models/${model.id}/fits`, spec)).status).toBe(403);
      expect((await post(s, `/fits/${fit.id}/cancel`, {})).status).toBe(403);
      expect((await post(s, `/fits/${fit.id}/choice`, { rule: 'minimum' })).status).toBe(403);
    });
  }

  it('an admin chooses lambda (allowed)', async () => {
    const res = await post(admin, `/fits/${fit.id}/choice`, { rule: 'minimum' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  });

  it('another workspace gets 404 for every model and fit route', async () => {
    const o = outsider;
    // The outsider's own workspace id with this workspace's ids: nothing is found.
    expect((await o.agent.get(`${apiBase(o)}/models/${model.id}`)).status).toBe(404);
    expect((await o.agent.get(`${apiBase(o)}/fits/${fit.id}`)).status).toBe(404);
    expect((await o.agent.get(`${apiBase(o)}/fits/${fit.id}/progress`)).status).toBe(404);
    expect((await o.agent.get(`${apiBase(o)}/fits/${fit.id}/predictions?datasetVersionId=${data.version.id}`)).status).toBe(404);
    expect((await post(o, `/models/${model.id}/fits`, spec)).status).toBe(404);
    expect((await post(o, `/fits/${fit.id}/cancel`, {})).status).toBe(404);
    expect((await post(o, `/fits/${fit.id}/choice`, { rule: 'minimum' })).status).toBe(404);
    const list = await o.agent.get(`${apiBase(o)}/models`);
    expect(list.body).toEqual([]);
    // This workspace's URL: not a member, 404.
    expect((await o.agent.get(`/api/workspaces/${admin.workspaceId}/fits/${fit.id}`)).status).toBe(404);
    // A model on another workspace's dataset cannot be made.
    const foreign = await post(o, '/models', { name: 'Foreign', datasetId: data.datasetId, outcome: 'y', family: 'gaussian' });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.field).toBe('datasetId');
  });

  it('a stranger gets 401; a POST without the CSRF header is refused', async () => {
    expect((await request(t.app).get(`${apiBase(admin)}/models`)).status).toBe(401);
    expect((await request(t.app).get(`${apiBase(admin)}/fits/${fit.id}`)).status).toBe(401);
    const noCsrf = await admin.agent.post(`${apiBase(admin)}/models/${model.id}/fits`).send(spec);
    expect(noCsrf.status).toBe(403);
  });

  it('a dataset with models cannot be deleted (the message names the model)', async () => {
    const res = await admin.agent.delete(`${apiBase(admin)}/datasets/${data.datasetId}`).set('X-Lariat-CSRF', admin.csrf);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/model "Access" \(1 fit\)/);
  });
});
