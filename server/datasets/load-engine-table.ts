/**
 * A dataset version's columns in the engine's form (numeric Float64Array with NaN for missing;
 * categorical Int32Array codes with -1 for missing), typed as the version's column schema says.
 * Default columns: every column not excluded from modelling.
 */
import type { Database } from '../db/client';
import { EngineInputError, type EngineColumn, type EngineTable } from '../engine/types';
import { loadStoredColumns } from './data/uploads';
import { findVersionRowById } from './data/versions';
import { ConversionProblem, loadAs } from './storage/convert';

export async function loadEngineTable(db: Database, versionId: string, columns?: string[]): Promise<EngineTable> {
  const version = await findVersionRowById(db, versionId);
  if (!version) throw new EngineInputError(`No dataset version ${versionId}.`, 'versionId');
  const schema = columns
    ? columns.map((name) => {
        const col = version.columns.find((c) => c.name === name);
        if (!col) throw new EngineInputError(`Column "${name}" is not in version ${version.number} of the dataset.`, 'columns');
        return col;
      })
    : version.columns.filter((c) => !c.excluded);
  const stored = await loadStoredColumns(
    db,
    version.uploadId,
    schema.map((c) => c.position),
  );
  const out: EngineColumn[] = stored.map((s, k) => {
    const col = schema[k];
    try {
      const loaded = loadAs(s, col.type);
      if (loaded.kind === 'text') throw new EngineInputError(`Column "${col.name}" is ${col.type === 'text' ? 'free text' : 'an identifier'}; change its type to use it in a model.`, 'columns');
      return loaded;
    } catch (error) {
      if (error instanceof ConversionProblem) throw new EngineInputError(error.message, 'columns');
      throw error;
    }
  });
  return { nRows: version.rowCount, columns: out };
}
