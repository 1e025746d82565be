/**
 * Fits API tests: the in-process app with a queue on its test database, an in-process fit worker
 * (engine threads), or worker processes (`tsx server/worker/main.ts`) for the kill and sharing tests.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { expect } from 'vitest';
import type { UploadResultDto } from '../../../shared/datasets';
import type { FitDetailDto, FitRequestInput, FitSummaryDto } from '../../../shared/fits';
import type { ModelListItemDto } from '../../../shared/models';
import { startFitWorker, type RunningWorker } from '../../../server/worker/start';
import { startTestApp, type TestApp } from '../../support/app';
import { withCsrf, type Session } from '../../support/session';
import { apiBase, closeApp, upload } from '../datasets/support';

export { regressionCsv } from './data';

/** Short expiry and polling so a killed worker's job is retried within seconds. */
export const FAST_QUEUE_ENV = {
  LARIAT_JOB_EXPIRE_SECONDS: '3',
  LARIAT_QUEUE_MAINTENANCE_SECONDS: '1',
  LARIAT_QUEUE_POLL_MS: '200',
  LARIAT_JOB_RETRIES: '3',
};

export interface FitsApp extends TestApp {
  workers: RunningWorker[];
  processes: ChildProcess[];
}

export async function startFitsApp(options: { inProcessWorker?: boolean } = {}): Promise<FitsApp> {
  const t = await startTestApp(FAST_QUEUE_ENV);
  const app: FitsApp = { ...t, workers: [], processes: [] };
  // On the test app's own queue, as one process runs one queue (server/queue/queue.ts).
  if (options.inProcessWorker !== false) app.workers.push(await startFitWorker(t.ctx.config, t.ctx.db, { name: 'in-process', queue: t.queue }));
  return app;
}

export async function closeFitsApp(app: FitsApp | undefined): Promise<void> {
  if (!app) return;
  for (const child of app.processes) if (child.exitCode === null) child.kill('SIGKILL');
  for (const w of app.workers) await w.stop();
  await closeApp(app);
}

/** A worker process on the test database, named so fold records show who ran what. */
export function spawnWorker(app: FitsApp, name: string, env: Record<string, string> = {}): ChildProcess {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/worker/main.ts'], {
    env: { ...process.env, ...FAST_QUEUE_ENV, NODE_ENV: 'test', DATABASE_URL: app.ctx.config.DATABASE_URL, LARIAT_WORKER_NAME: name, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout?.on('data', () => undefined);
  child.stderr?.on('data', (d: Buffer) => {
    if (process.env.LARIAT_TEST_VERBOSE) process.stderr.write(`[${name}] ${d.toString()}`);
  });
  app.processes.push(child);
  return child;
}

export async function uploadCsv(s: Session, csv: string, name: string): Promise<UploadResultDto> {
  const res = await upload(s, csv, `${name}.csv`, { name });
  expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
  return res.body as UploadResultDto;
}

export async function createModel(s: Session, body: { name: string; datasetId: string; outcome: string; family: 'gaussian' | 'binomial' }): Promise<ModelListItemDto> {
  const res = await post(s, '/models', body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as ModelListItemDto;
}

export function post(s: Session, path: string, body: object) {
  return withCsrf(s.agent.post(`${apiBase(s)}${path}`), s.csrf).send(body);
}

export async function runFit(s: Session, modelId: string, spec: FitRequestInput): Promise<FitSummaryDto> {
  const res = await post(s, `/models/${modelId}/fits`, spec);
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  return res.body as FitSummaryDto;
}

export async function waitForFit(s: Session, fitId: string, until: (f: FitDetailDto) => boolean = (f) => ['finished', 'failed', 'cancelled'].includes(f.status), timeoutMs = 90_000): Promise<FitDetailDto> {
  const started = Date.now();
  for (;;) {
    const res = await s.agent.get(`${apiBase(s)}/fits/${fitId}`);
    expect(res.status).toBe(200);
    const fit = res.body as FitDetailDto;
    if (until(fit)) return fit;
    if (Date.now() - started > timeoutMs) throw new Error(`fit ${fitId} still ${fit.status} after ${timeoutMs} ms: ${JSON.stringify(fit.progress)}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}
