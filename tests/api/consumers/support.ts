/**
 * Consumer API tests: an app with an in-process fit worker, a workspace with a finished gaussian and
 * binomial fit, releases inserted as fixtures (the review flow that makes them is the release half's
 * and has its own tests), and helpers for keys. The tests' local webhook receiver is allowed through
 * LARIAT_WEBHOOK_ALLOWED_HOSTS=127.0.0.1, exactly as an operator would allow one.
 */
import { eq, max } from 'drizzle-orm';
import request from 'supertest';
import { expect } from 'vitest';
import type { CreatedKeyDto, CreateKeyInput } from '../../../shared/consumers';
import type { FitDetailDto, FitRequestInput } from '../../../shared/fits';
import { fits, releases } from '../../../server/db/schema/index';
import { startFitWorker } from '../../../server/worker/start';
import { startTestApp } from '../../support/app';
import { signUp, withCsrf, type Session } from '../../support/session';
import { apiBase } from '../datasets/support';
import { createModel, FAST_QUEUE_ENV, regressionCsv, runFit, uploadCsv, waitForFit, type FitsApp } from '../fits/support';

export { closeFitsApp } from '../fits/support';

export interface Fixture {
  t: FitsApp;
  admin: Session;
  gaussian: FitDetailDto;
  binomial: FitDetailDto;
  /** The source table the fits were made from. */
  csv: string;
}

export const SPEC: FitRequestInput = { predictors: ['x1', 'x2', 'n1', 'g'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 15 }, cv: { kind: 'folds', folds: 3, seed: 5 } };

export async function startConsumersApp(env: Record<string, string> = {}): Promise<FitsApp> {
  const t = await startTestApp({ ...FAST_QUEUE_ENV, LARIAT_WEBHOOK_ALLOWED_HOSTS: '127.0.0.1', LARIAT_WEBHOOK_RETRY_SECONDS: '1', ...env });
  const queue = t.queue;
  const app: FitsApp = { ...t, workers: [], processes: [] };
  app.workers.push(await startFitWorker(t.ctx.config, t.ctx.db, { name: 'in-process', queue }));
  return app;
}

/** One workspace with a finished gaussian fit (model "Consumer y") and binomial fit (model "Consumer yes"). */
export async function fixture(env: Record<string, string> = {}): Promise<Fixture> {
  const t = await startConsumersApp(env);
  const admin = await signUp(t.app);
  const csv = regressionCsv(150, 2);
  const data = await uploadCsv(admin, csv, 'Consumer data');
  const g = await createModel(admin, { name: 'Consumer y', datasetId: data.datasetId, outcome: 'y', family: 'gaussian' });
  const b = await createModel(admin, { name: 'Consumer yes', datasetId: data.datasetId, outcome: 'yes', family: 'binomial' });
  const [gaussian, binomial] = await Promise.all([runFit(admin, g.id, SPEC), runFit(admin, b.id, SPEC)].map(async (p) => waitForFit(admin, (await p).id)));
  expect(gaussian.status, gaussian.message ?? '').toBe('finished');
  expect(binomial.status, binomial.message ?? '').toBe('finished');
  return { t, admin, gaussian, binomial, csv };
}

/** Inserts the next release of the fit's model at its chosen lambda (a fixture, not the review flow). */
export async function release(t: FitsApp, fit: FitDetailDto, userId: string, lambdaIndex = fit.results!.chosen.index) {
  const db = t.ctx.db;
  const [f] = await db.select({ workspaceId: fits.workspaceId }).from(fits).where(eq(fits.id, fit.id));
  const [last] = await db.select({ n: max(releases.number) }).from(releases).where(eq(releases.modelId, fit.modelId));
  const [row] = await db
    .insert(releases)
    .values({ workspaceId: f.workspaceId, modelId: fit.modelId, fitId: fit.id, number: (last?.n ?? 0) + 1, notes: 'fixture release', releasedBy: userId, lambdaIndex })
    .returning();
  return row;
}

export async function createKey(s: Session, body: CreateKeyInput): Promise<CreatedKeyDto> {
  const res = await withCsrf(s.agent.post(`${apiBase(s)}/keys`), s.csrf).send(body);
  expect(res.status, res.text).toBe(201);
  return res.body as CreatedKeyDto;
}

/** A request to the consumer API with a key (no cookies: a fresh supertest request). */
export function v1(t: FitsApp, key: string | null, method: 'get' | 'post', path: string) {
  const req = request(t.app)[method](`/api/v1${path}`);
  return key === null ? req : req.set('Authorization', `Bearer ${key}`);
}

export const close = (a: number, b: number, tol = 1e-9) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(a), Math.abs(b));
