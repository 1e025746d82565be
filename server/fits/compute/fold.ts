/**
 * One cross-validation fold of a fit (a queue job of its own, run on an engine thread): the engine's
 * plan on the same table and spec as the full path (so fold ids and encoding agree), then fold k on
 * the full path's lambdas.
 */
import type { FitSpec } from '../../../shared/fits';
import { encodeForFit, planCrossValidation, runPlannedFold, type EngineTable, type PathResult } from '../../engine/index';
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

export function runFold(table: EngineTable, spec: FitSpec, lambda: number[], fold: number): FoldOutput {
  const started = performance.now();
  const es = engineSpec(spec);
  const prepared = encodeForFit(table, es);
  // The plan reads only the path's lambdas.
  const plan = planCrossValidation(table, es, { lambda } as PathResult, prepared);
  const result = runPlannedFold(plan, fold);
  const p = prepared.built.design.p;
  const support = new Uint8Array(lambda.length * p);
  result.support.forEach((kept, l) => {
    for (const j of kept) support[l * p + j] = 1;
  });
  return { fold, nTest: result.nTest, losses: result.losses, statuses: result.statuses, support, timeMs: Math.round(performance.now() - started) };
}
