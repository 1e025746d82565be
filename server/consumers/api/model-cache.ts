/**
 * Released fits kept in memory for scoring: a finished fit's results never change (a trigger refuses
 * it, see the fits migration), and a release names its lambda, so (workspace, fit, lambda index)
 * always means the same numbers. Which release is current is still read from the database on every
 * request; only the fit's decoded coefficients are reused. A handful of entries, oldest dropped first.
 */
import type { Database } from '../../db/client';
import { loadChosenModel, type ChosenModel } from '../../exports/chosen-model';

const MAX_ENTRIES = 32;
const cache = new Map<string, ChosenModel>();

export async function releasedModel(db: Database, workspaceId: string, fitId: string, lambdaIndex: number): Promise<ChosenModel> {
  const key = `${workspaceId}:${fitId}:${lambdaIndex}`;
  const hit = cache.get(key);
  if (hit) {
    cache.delete(key); // most recently used last
    cache.set(key, hit);
    return hit;
  }
  const model = await loadChosenModel(db, workspaceId, fitId, lambdaIndex);
  cache.set(key, model);
  if (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value!);
  return model;
}
