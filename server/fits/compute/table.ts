/** The rows a fit uses: an optional seeded holdout split of the dataset version's table. */
import type { FitSpec } from '../../../shared/fits';
import { createRng, type EngineColumn, type EngineTable } from '../../engine/index';

export function subsetTable(table: EngineTable, rows: ArrayLike<number>): EngineTable {
  const n = rows.length;
  const columns: EngineColumn[] = table.columns.map((c) => {
    if (c.kind === 'numeric') {
      const values = new Float64Array(n);
      for (let i = 0; i < n; i++) values[i] = c.values[rows[i]];
      return { name: c.name, kind: 'numeric', values };
    }
    const codes = new Int32Array(n);
    for (let i = 0; i < n; i++) codes[i] = c.codes[rows[i]];
    return { name: c.name, kind: 'categorical', codes, levels: c.levels };
  });
  return { nRows: n, columns };
}

export interface SplitTable {
  train: EngineTable;
  holdout: EngineTable | null;
  /** Table rows (0-based) of each holdout row, to name rows in messages. */
  holdoutRows: Int32Array | null;
}

/**
 * Without a holdout: the whole table. With one: round(share * n) rows chosen by a seeded shuffle
 * (Fisher-Yates on the engine's generator), kept in table order on both sides.
 */
export function splitHoldout(table: EngineTable, holdout: FitSpec['holdout']): SplitTable {
  if (!holdout) return { train: table, holdout: null, holdoutRows: null };
  const n = table.nRows;
  const order = Int32Array.from({ length: n }, (_, i) => i);
  const rng = createRng(holdout.seed);
  for (let i = n - 1; i > 0; i--) {
    const j = rng.int(i + 1);
    const t = order[i];
    order[i] = order[j];
    order[j] = t;
  }
  const size = Math.round(holdout.share * n);
  const held = new Uint8Array(n);
  for (let k = 0; k < size; k++) held[order[k]] = 1;
  const trainRows: number[] = [];
  const holdRows: number[] = [];
  for (let i = 0; i < n; i++) (held[i] ? holdRows : trainRows).push(i);
  return { train: subsetTable(table, trainRows), holdout: subsetTable(table, holdRows), holdoutRows: Int32Array.from(holdRows) };
}

/** The columns a spec reads from the dataset version. */
export function columnsOfSpec(spec: FitSpec): string[] {
  return [...new Set([spec.outcome, ...spec.predictors, ...(spec.cv.kind === 'column' ? [spec.cv.column] : [])])];
}
