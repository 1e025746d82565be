/**
 * Review and release API tests: one workspace with every role, a finished fit run by the analyst, and
 * helpers for the review and release routes. Fits are small (120 rows, 10 lambdas, 3 folds).
 */
import { expect } from 'vitest';
import type { FitDetailDto, FitRequestInput } from '../../../shared/fits';
import type { ModelListItemDto } from '../../../shared/models';
import type { ReleaseDto, ReviewDetailDto, ReviewDto } from '../../../shared/reviews';
import { inviteAndJoin, signUp, uniqueEmail, withCsrf, type Session } from '../../support/session';
import { apiBase } from '../datasets/support';
import { createModel, post, regressionCsv, runFit, startFitsApp, uploadCsv, waitForFit, type FitsApp } from '../fits/support';

export const SMALL_SPEC: FitRequestInput = { predictors: ['x1', 'x2', 'g'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 2 } };

export interface Team {
  t: FitsApp;
  admin: Session;
  analyst: Session;
  reviewer: Session;
  viewer: Session;
  outsider: Session;
  datasetId: string;
  model: ModelListItemDto;
}

export async function startTeam(): Promise<Team> {
  const t = await startFitsApp();
  const admin = await signUp(t.app);
  const analyst = await inviteAndJoin(t, admin, uniqueEmail('analyst'), 'analyst', 'Ana Analyst');
  const reviewer = await inviteAndJoin(t, admin, uniqueEmail('reviewer'), 'reviewer', 'Rey Reviewer');
  const viewer = await inviteAndJoin(t, admin, uniqueEmail('viewer'), 'viewer', 'Vi Viewer');
  const outsider = await signUp(t.app);
  const data = await uploadCsv(admin, regressionCsv(120, 2), 'Reviewed');
  const model = await createModel(analyst, { name: 'Reviewed', datasetId: data.datasetId, outcome: 'y', family: 'gaussian' });
  return { t, admin, analyst, reviewer, viewer, outsider, datasetId: data.datasetId, model };
}

export async function finishedFit(s: Session, modelId: string, spec: FitRequestInput = SMALL_SPEC): Promise<FitDetailDto> {
  const fit = await waitForFit(s, (await runFit(s, modelId, spec)).id);
  expect(fit.status).toBe('finished');
  return fit;
}

export const get = (s: Session, path: string) => s.agent.get(`${apiBase(s)}${path}`);
export { post };

export async function askReview(s: Session, fitId: string, note = 'Please check the new predictors.'): Promise<ReviewDto> {
  const res = await post(s, `/fits/${fitId}/reviews`, { note });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as ReviewDto;
}

export async function decide(s: Session, reviewId: string, decision: 'approve' | 'send-back', reasons = ''): Promise<ReviewDetailDto> {
  const res = await post(s, `/reviews/${reviewId}/decision`, { decision, reasons });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as ReviewDetailDto;
}

export async function release(s: Session, modelId: string, fitId: string, notes = 'First release.'): Promise<ReleaseDto> {
  const res = await post(s, `/models/${modelId}/releases`, { fitId, notes });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as ReleaseDto;
}

export const put = (s: Session, path: string, body: object) => withCsrf(s.agent.put(path), s.csrf).send(body);

/** Waits a moment for queued e-mails, then the messages to `to` whose subject matches, after `afterId`. */
export async function mailsTo(t: FitsApp, to: string, subject: RegExp, afterId: number, waitMs = 1500): Promise<{ subject: string; text: string }[]> {
  await new Promise((r) => setTimeout(r, waitMs));
  return t.mail.messages.filter((m) => m.id > afterId && m.to.includes(to.toLowerCase()) && subject.test(m.subject));
}
