/**
 * What depends on a dataset (fits, once they exist). The fits area registers a hook that describes
 * each dependent in words ("fit 3 of model 'Price'"); deletion is refused while any hook returns one.
 * A hook instead of a foreign key because the fits table does not exist yet; a fit's foreign key to
 * dataset_versions (ON DELETE RESTRICT) should be added with it as a second line of defence.
 */
import type { Executor } from '../data/executor';

export type DependentsHook = (db: Executor, datasetId: string) => Promise<string[]>;

const hooks = new Set<DependentsHook>();

/** Returns the function that removes the hook again. */
export function registerDatasetDependents(hook: DependentsHook): () => void {
  hooks.add(hook);
  return () => hooks.delete(hook);
}

export async function findDependents(db: Executor, datasetId: string): Promise<string[]> {
  const found: string[] = [];
  for (const hook of hooks) found.push(...(await hook(db, datasetId)));
  return found;
}
