/**
 * One cross-validation fold of a fit (a queue job of its own, run on an engine thread): the engine's
 * plan on the same table and spec as the full path (so fold ids and encoding agree), then fold k on
 * the full path's lambdas.
 */
import type { FitSpec } from '../../../shared/fits';
import { encodeForFit, planCrossValidation, runPlannedFold, type CvPlan, type EngineTable, type PathResult } from '../../engine/index';
import { engineSpec } from '../engine-spec';

export interface FoldOutput {
  fold: number;
  nTest: number;
  losses: Partial<Record<string, number[]>>;
  statuses: string[];
  /** Uint8Array [lambda][term]: 1 where the fold's fit keeps the term. */
  support: Uint8Array;
  timeMs: number;
}

/**
 * The last plan this thread made, by fit: a worker often runs several folds of one fit in a row, and
 * the plan (encoding, fold ids, cross products of all rows) is the same for all of them. The plan is
 * only read by a fold, so reusing it changes no result.
 */
let lastPlan: { key: string; plan: CvPlan } | null = null;

export function runFold(table: EngineTable, spec: FitSpec, lambda: number[], fold: number, planKey?: string): FoldOutput {
  const started = performance.now();
  let plan = planKey !== undefined && lastPlan?.key === planKey ? lastPlan.plan : null;
  if (!plan) {
    const es = engineSpec(spec);
    // The plan reads only the path's lambdas.
    plan = planCrossValidation(table, es, { lambda } as PathResult, encodeForFit(table, es));
    lastPlan = planKey !== undefined ? { key: planKey, plan } : null;
  }
  const result = runPlannedFold(plan, fold);
  const p = plan.built.design.p;
  const support = new Uint8Array(lambda.length * p);
  result.support.forEach((kept, l) => {
    for (const j of kept) support[l * p + j] = 1;
  });
  return { fold, nTest: result.nTest, losses: result.losses, statuses: result.statuses, support, timeMs: Math.round(performance.now() - started) };
}
