/**
 * Consumer API scoring speed: 10,000 rows scored by POST /api/v1/models/:modelId/score against the
 * target "under 200 ms on the server" (issue 11). An in-process app on a fresh test database (same
 * setup as the API tests: run it with LARIAT_TEST_DATABASE_ADMIN_URL pointing at your cluster) makes
 * a released 20-predictor fit (one of them categorical), then times the whole HTTP request (body
 * parsing, key check, release lookup, scoring, JSON answer) for JSON and CSV bodies, p50 and p95 of
 * BENCH_SCORING_RUNS runs, as the server reports it in its Server-Timing header (from the request's
 * arrival to the answer's text; the client's own serializing and parsing are not the server's time). Reference measured in the same run: JSON.parse + JSON.stringify of the
 * same request and answer bodies alone, the serialization no JSON API can avoid; the ratio shows
 * what the server adds to it.
 */
import './lib/test-template';
import { eq, max } from 'drizzle-orm';
import request from 'supertest';
import { fits, releases } from '../server/db/schema/index';
import { startFitWorker } from '../server/worker/start';
import { regressionCsv } from '../tests/api/fits/data';
import { closeApp, upload } from '../tests/api/datasets/support';
import setupTemplate from '../tests/support/api-global-setup';
import { startTestApp } from '../tests/support/app';
import { signUp, withCsrf } from '../tests/support/session';

const ROWS = 10_000;
const RUNS = Number(process.env.BENCH_SCORING_RUNS ?? '15');
const TARGET_MS = 200;

const quantile = (xs: number[], q: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(q * xs.length))];

function rowsOf(csv: string): Record<string, number | string>[] {
  const [head, ...lines] = csv.trim().split('\n');
  const names = head.split(',');
  return lines.map((l) => Object.fromEntries(l.split(',').map((v, i) => [names[i], names[i] === 'g' || names[i] === 'yes' ? v : Number(v)])));
}

export async function run(): Promise<void> {
  const dropTemplate = await setupTemplate();
  const t = await startTestApp({ LARIAT_JOB_EXPIRE_SECONDS: '30', LARIAT_QUEUE_POLL_MS: '200' });
  const queue = t.queue;
  const worker = await startFitWorker(t.ctx.config, t.ctx.db, { name: 'bench', queue });
  try {
    const s = await signUp(t.app);
    const base = `/api/workspaces/${s.workspaceId}`;
    const up = await upload(s, regressionCsv(2000, 17), 'scoring.csv', { name: 'Scoring bench' });
    if (up.status >= 300) throw new Error(`upload: ${up.status} ${up.text}`);
    const model = await withCsrf(s.agent.post(`${base}/models`), s.csrf).send({ name: 'Scoring', datasetId: up.body.datasetId, outcome: 'y', family: 'gaussian' });
    const predictors = ['x1', 'x2', ...Array.from({ length: 17 }, (_, k) => `n${k + 1}`), 'g'];
    const fit = await withCsrf(s.agent.post(`${base}/models/${model.body.id}/fits`), s.csrf).send({ predictors, penalty: 'lasso', path: { kind: 'explicit', lambdas: [0.001] }, cv: { kind: 'none' } });
    if (fit.status !== 202) throw new Error(`fit: ${fit.status} ${fit.text}`);
    for (let i = 0; ; i++) {
      const d = await s.agent.get(`${base}/fits/${fit.body.id}`);
      if (d.body.status === 'finished') break;
      if (['failed', 'cancelled'].includes(d.body.status) || i > 600) throw new Error(`fit ended ${d.body.status}: ${d.body.message}`);
      await new Promise((r) => setTimeout(r, 200));
    }
    const [f] = await t.ctx.db.select({ workspaceId: fits.workspaceId, modelId: fits.modelId }).from(fits).where(eq(fits.id, fit.body.id));
    const [last] = await t.ctx.db.select({ n: max(releases.number) }).from(releases).where(eq(releases.modelId, f.modelId));
    await t.ctx.db.insert(releases).values({ workspaceId: f.workspaceId, modelId: f.modelId, fitId: fit.body.id, number: (last?.n ?? 0) + 1, notes: 'bench', releasedBy: s.userId, lambdaIndex: 0 });
    const key = await withCsrf(s.agent.post(`${base}/keys`), s.csrf).send({ name: 'bench', scope: 'workspace' });
    const csv = regressionCsv(ROWS, 17, 11);
    const rows = rowsOf(csv);
    const json = JSON.stringify({ rows });
    const url = `/api/v1/models/${f.modelId}/score`;

    const time = async (send: () => Promise<request.Response>) => {
      const ms: number[] = [];
      const server: number[] = [];
      let answer = '';
      for (let i = 0; i < RUNS + 3; i++) {
        const started = process.hrtime.bigint();
        const res = await send();
        const took = Number(process.hrtime.bigint() - started) / 1e6;
        if (res.status !== 200 || res.body.rows.length !== ROWS || res.body.rowErrors !== 0) throw new Error(`score: ${res.status} ${res.text.slice(0, 300)}`);
        answer = res.text;
        if (i >= 3) {
          ms.push(took); // after 3 warm-up requests
          server.push(Number(/app;dur=([\d.]+)/.exec(String(res.headers['server-timing']))?.[1]));
        }
      }
      return { ms, server, answer };
    };
    const viaJson = await time(() => request(t.app).post(url).set('Authorization', `Bearer ${key.body.key}`).set('Content-Type', 'application/json').send(json));
    const viaCsv = await time(() => request(t.app).post(url).set('Authorization', `Bearer ${key.body.key}`).set('Content-Type', 'text/csv').send(csv));

    const reference: number[] = [];
    for (let i = 0; i < RUNS; i++) {
      const started = process.hrtime.bigint();
      JSON.stringify(JSON.parse(json));
      JSON.stringify(JSON.parse(viaJson.answer));
      reference.push(Number(process.hrtime.bigint() - started) / 1e6);
    }
    const ref = quantile(reference, 0.5);
    for (const [name, r] of [['JSON body', viaJson], ['CSV body', viaCsv]] as const) {
      const p50 = quantile(r.server, 0.5);
      const p95 = quantile(r.server, 0.95);
      console.log(
        `score ${ROWS} rows, ${name}: on the server (Server-Timing, arrival to answer text) p50 ${p50.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms ` +
          `(target < ${TARGET_MS} ms: p50 ${p50 < TARGET_MS ? 'met' : 'NOT met'}, p95 ${p95 < TARGET_MS ? 'met' : 'NOT met'}); ` +
          `${(p50 / ref).toFixed(1)}x the bare JSON parse+stringify of request and answer (${ref.toFixed(1)} ms, same run); ` +
          `whole round trip with the client's own work p50 ${quantile(r.ms, 0.5).toFixed(1)} ms`,
      );
    }
    console.log(`machine load (1-minute average) at the end: ${(await import('node:os')).loadavg()[0].toFixed(1)} on ${(await import('node:os')).cpus().length} cores`);
  } finally {
    await worker.stop();
    await closeApp(t);
    await dropTemplate();
  }
}
