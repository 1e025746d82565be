/**
 * Choosing a finished fit's lambda (the one change a finished version allows): a CV rule or any
 * index on the path. The refit and diagnostics for a new index are queued for a worker.
 */
import { and, eq, sql } from 'drizzle-orm';
import { chooseLambdaSchema, type ChoiceRule } from '../../../shared/fits';
import type { AppContext } from '../../context';
import { fitEvaluations, fits } from '../../db/schema/index';
import { badRequest, conflict, fromZod } from '../../http/errors';
import { jobId } from '../jobs';
import { requireFit } from './detail';
import { keyMetrics } from './key-metrics';

export async function chooseLambda(ctx: AppContext, workspaceId: string, userId: string, fitId: string, body: unknown): Promise<void> {
  const parsed = chooseLambdaSchema.safeParse(body);
  if (!parsed.success) throw fromZod(parsed.error);
  const fit = await requireFit(ctx.db, workspaceId, fitId);
  if (fit.status !== 'finished') throw conflict(`This fit is ${fit.status}; a lambda can be chosen once it has finished.`, 'status');
  const [row] = await ctx.db.select({ results: fits.results }).from(fits).where(eq(fits.id, fit.id));
  const r = row?.results;
  if (!r) throw conflict('This fit has no stored results.', 'status');
  let index: number;
  let rule: ChoiceRule;
  if ('rule' in parsed.data) {
    if (!r.cv) throw badRequest('rule: this fit has no cross-validation; choose a lambda by its position (index).', 'rule');
    rule = parsed.data.rule;
    index = rule === 'minimum' ? r.cv.minimum.index : r.cv.oneStandardError.index;
  } else {
    index = parsed.data.index;
    if (index >= r.lambda.length) throw badRequest(`index: the path has ${r.lambda.length} lambdas, numbered 0 to ${r.lambda.length - 1}.`, 'index');
    rule = 'manual';
  }
  const queueEvaluation = await ctx.db.transaction(async (tx) => {
    const [existing] = await tx
      .select({ result: fitEvaluations.result, state: fitEvaluations.state })
      .from(fitEvaluations)
      .where(and(eq(fitEvaluations.fitId, fit.id), eq(fitEvaluations.lambdaIndex, index)));
    await tx
      .update(fits)
      .set({ chosenIndex: index, chosenRule: rule, chosenBy: userId, chosenAt: sql`now()`, keyMetrics: keyMetrics(r, index, rule, existing?.result?.holdout ?? null) })
      .where(eq(fits.id, fit.id));
    if (existing) return false;
    await tx.insert(fitEvaluations).values({ fitId: fit.id, lambdaIndex: index, state: 'waiting' }).onConflictDoNothing();
    return true;
  });
  if (queueEvaluation) await ctx.queue.send('fit-evaluate', { fitId: fit.id, index }, { id: jobId('evaluate', fit.id, index) });
}
