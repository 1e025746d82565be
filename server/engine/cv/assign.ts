/** The fold id of every used row of a built design, from the spec's CvSpec. */
// Direct imports (not ../index): path/fitPath.ts plans the folds through foldData.ts.
import { findColumn, type BuiltDesign } from '../design/build';
import { createRng } from '../random';
import { EngineInputError, type CvSpec, type EngineTable, type FitSpec } from '../types';
import { assignFolds, checkFoldsNonEmpty, foldIdsFromColumn } from './folds';

export function foldAssignment(
  table: EngineTable,
  spec: FitSpec,
  cv: CvSpec,
  built: BuiltDesign,
): { foldIds: Int32Array; folds: number } {
  if (cv.foldColumn !== undefined) {
    if (spec.predictors.includes(cv.foldColumn) || spec.response === cv.foldColumn) {
      throw new EngineInputError(
        `fold column "${cv.foldColumn}" cannot also be the response or a predictor`,
        'foldColumn',
      );
    }
    const column = findColumn(table, cv.foldColumn, 'foldColumn');
    if (column.kind !== 'numeric') {
      throw new EngineInputError(`fold column "${cv.foldColumn}" must hold integer fold ids, not text`, 'foldColumn');
    }
    const values = Float64Array.from(built.rows, (row) => column.values[row]);
    const result = foldIdsFromColumn(cv.foldColumn, values, (i) => `row ${built.rows[i] + 1}`);
    checkFoldsNonEmpty(result.foldIds, result.folds);
    return result;
  }
  const rng = createRng(cv.seed);
  const strata = spec.family === 'binomial' ? built.y : undefined;
  const foldIds = assignFolds(built.rows.length, cv.folds, () => rng.next(), strata);
  checkFoldsNonEmpty(foldIds, cv.folds);
  return { foldIds, folds: cv.folds };
}
