/**
 * The demo workspace's finished fit (idempotent): a model of the demo data's yield and one
 * cross-validated elastic-net fit, run here in order through the same job steps a worker runs
 * (inline engine, no queue), so a newcomer sees results on first sign-in.
 */
import { and, eq } from 'drizzle-orm';
import type { FitRequestInput } from '../../shared/fits';
import type { AppContext } from '../context';
import { listVersionRows } from '../datasets/data/versions';
import type { Database } from '../db/client';
import { fits, models } from '../db/schema/index';
import type { QueuedJob } from '../queue/queue';
import { fitJobHandler } from '../worker/fit-jobs';
import { InlineEngine } from '../worker/inline-engine';
import type { FitQueue } from './jobs';
import { runFit } from './service/run';

export const DEMO_MODEL_NAME = 'Yield per 100 l (demo)';
const OUTCOME = 'yield_kg_per_100l';

export async function ensureDemoFit(db: Database, input: { workspaceId: string; userId: string; datasetId: string }): Promise<string> {
  const [existing] = await db.select({ id: models.id }).from(models).where(and(eq(models.workspaceId, input.workspaceId), eq(models.name, DEMO_MODEL_NAME)));
  const modelId =
    existing?.id ??
    (
      await db
        .insert(models)
        .values({
          workspaceId: input.workspaceId,
          name: DEMO_MODEL_NAME,
          description: 'Which of the vat measurements predict cheese yield? Invented demo data.',
          datasetId: input.datasetId,
          outcome: OUTCOME,
          family: 'gaussian',
          createdBy: input.userId,
        })
        .returning({ id: models.id })
    )[0].id;
  const [done] = await db.select({ id: fits.id }).from(fits).where(and(eq(fits.modelId, modelId), eq(fits.status, 'finished')));
  if (done) return done.id;

  const versions = await listVersionRows(db, [input.datasetId]);
  const latest = versions[versions.length - 1];
  // `notes` is left out: an empty note means "nothing to report", not an unknown value, so filling
  // its 611 blanks with the most common note ("milk delivery late") would teach the demo a falsehood.
  const predictors = latest.columns
    .filter((c) => !c.excluded && c.name !== OUTCOME && c.name !== 'top_grade' && c.name !== 'notes' && ['numeric', 'binary', 'categorical'].includes(c.type))
    .map((c) => c.name);
  const spec: FitRequestInput = {
    predictors,
    penalty: 'elastic-net',
    l1Share: 0.8,
    path: { kind: 'automatic', pathLength: 60 },
    cv: { kind: 'folds', folds: 10, seed: 2026 },
    missing: 'impute',
  };
  const queued: QueuedJob<unknown>[] = [];
  const send = (name: FitQueue, data: object) => {
    queued.push({ id: `${name}-${queued.length}`, name, data, retryCount: 0 });
    return Promise.resolve();
  };
  const ctx = { db, queue: { send } } as unknown as AppContext;
  const fit = await runFit(ctx, input.workspaceId, input.userId, modelId, spec);
  const handle = fitJobHandler({ db, send, name: 'demo-seed', retryLimit: 0 }, new InlineEngine());
  for (let job = queued.shift(); job; job = queued.shift()) await handle(job);
  return fit.id;
}
