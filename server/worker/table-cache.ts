/**
 * Dataset tables a worker process has loaded, by dataset version and columns: the folds of one fit
 * read the same table, so each worker process loads it once. A dataset version never changes, so
 * nothing here goes stale; the cache only bounds memory (the two most recent tables).
 */
import type { Database } from '../db/client';
import { loadEngineTable } from '../datasets/load-engine-table';
import type { EngineTable } from '../engine/index';

const LIMIT = 2;
const cache = new Map<string, Promise<EngineTable>>();

export function cachedTable(db: Database, versionId: string, columns: string[]): Promise<EngineTable> {
  const key = `${versionId}\0${columns.join('\0')}`;
  const hit = cache.get(key);
  if (hit) {
    cache.delete(key);
    cache.set(key, hit);
    return hit;
  }
  const loading = loadEngineTable(db, versionId, columns);
  loading.catch(() => cache.delete(key));
  cache.set(key, loading);
  while (cache.size > LIMIT) cache.delete(cache.keys().next().value as string);
  return loading;
}
