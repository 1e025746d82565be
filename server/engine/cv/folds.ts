/**
 * Fold assignment: seeded random folds (stratified by class for binomial outcomes), or fold ids read
 * from a column. Fold ids are 0-based, one per used row.
 */
import { EngineInputError } from '../types';

/** Fisher-Yates shuffle (Knuth, TAOCP vol. 2, algorithm 3.4.2P) driven by a seeded uniform [0, 1). */
function shuffle(items: number[], uniform: () => number): number[] {
  for (let i = items.length - 1; i > 0; i--) {
    const j = Math.floor(uniform() * (i + 1));
    const t = items[i];
    items[i] = items[j];
    items[j] = t;
  }
  return items;
}

export function checkFoldCount(folds: number, nRows: number): void {
  if (!Number.isInteger(folds) || folds < 2) {
    throw new EngineInputError(`folds must be an integer of at least 2 (got ${folds})`, 'folds');
  }
  if (folds > nRows) {
    throw new EngineInputError(
      `folds (${folds}) cannot exceed the number of usable rows (${nRows})`,
      'folds',
    );
  }
}

/**
 * Random folds of near-equal size. With `strata` (e.g. the 0/1 outcome) each stratum is shuffled on
 * its own and dealt round-robin, continuing the deal across strata, so every fold gets each class in
 * proportion (to within one row) and fold sizes differ by at most one (common practice).
 */
export function assignFolds(
  nRows: number,
  folds: number,
  uniform: () => number,
  strata?: ArrayLike<number>,
): Int32Array {
  checkFoldCount(folds, nRows);
  const ids = new Int32Array(nRows);
  const groups = new Map<number, number[]>();
  for (let i = 0; i < nRows; i++) {
    const key = strata ? strata[i] : 0;
    const group = groups.get(key);
    if (group) group.push(i);
    else groups.set(key, [i]);
  }
  let dealt = 0;
  const keys = [...groups.keys()].sort((a, b) => a - b);
  for (const key of keys) {
    for (const row of shuffle(groups.get(key) as number[], uniform)) {
      ids[row] = dealt % folds;
      dealt++;
    }
  }
  return ids;
}

/**
 * Fold ids from a column of integers (any integers: distinct values are mapped, in ascending order,
 * to 0..K-1). `rowLabel(i)` names row i in messages (e.g. its 1-based data row in the file).
 */
export function foldIdsFromColumn(
  column: string,
  values: ArrayLike<number>,
  rowLabel: (i: number) => string = (i) => `row ${i + 1}`,
): { foldIds: Int32Array; folds: number } {
  const distinct = new Set<number>();
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isInteger(v)) {
      throw new EngineInputError(
        `fold column "${column}" must hold integer fold ids; ${rowLabel(i)} has ${Number.isNaN(v) ? 'a missing value' : v}`,
        'foldColumn',
      );
    }
    distinct.add(v);
  }
  const sorted = [...distinct].sort((a, b) => a - b);
  if (sorted.length < 2) {
    throw new EngineInputError(
      `fold column "${column}" must hold at least 2 distinct fold ids (found ${sorted.length})`,
      'foldColumn',
    );
  }
  const index = new Map(sorted.map((v, k) => [v, k]));
  const foldIds = new Int32Array(values.length);
  for (let i = 0; i < values.length; i++) foldIds[i] = index.get(values[i]) as number;
  return { foldIds, folds: sorted.length };
}

/** Every fold 0..K-1 must hold at least one row (messages number folds from 1). */
export function checkFoldsNonEmpty(foldIds: Int32Array, folds: number): void {
  const counts = new Int32Array(folds);
  for (const f of foldIds) {
    if (f < 0 || f >= folds) throw new EngineInputError(`fold id ${f} is outside 0..${folds - 1}`, 'folds');
    counts[f]++;
  }
  const empty = counts.findIndex((c) => c === 0);
  if (empty >= 0) throw new EngineInputError(`fold ${empty + 1} of ${folds} has no rows`, 'folds');
}
