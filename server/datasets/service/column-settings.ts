/**
 * Column settings (type overrides and exclusions) make a new version that shares the stored upload
 * of the version they start from (docs/decisions/0003). Each changed column is converted once to
 * check that its values allow the new type and to compute its summary.
 */
import type { ColumnSchema, ColumnSettingsInput, VersionSummaryDto } from '../../../shared/datasets';
import type { Database } from '../../db/client';
import { badRequest } from '../../http/errors';
import { nextVersionNumber } from '../data/datasets';
import { loadStoredColumns } from '../data/uploads';
import { findVersionRowById, insertVersion } from '../data/versions';
import { ConversionProblem, loadAs } from '../storage/convert';
import { summarize } from '../summary';
import { requireVersion } from './datasets';
import { versionSummary } from './dto';

export async function changeColumnSettings(
  db: Database,
  scope: { workspaceId: string; userId: string; datasetId: string; number: number },
  input: ColumnSettingsInput,
): Promise<VersionSummaryDto> {
  const { version } = await requireVersion(db, scope.workspaceId, scope.datasetId, scope.number);
  const columns: ColumnSchema[] = version.columns.map((c) => ({ ...c }));
  let changed = 0;
  for (const [i, setting] of input.columns.entries()) {
    const col = columns.find((c) => c.name === setting.name);
    if (!col) throw badRequest(`columns.${i}.name: version ${version.number} has no column "${setting.name}".`, `columns.${i}.name`);
    if (col.type === setting.type && col.excluded === setting.excluded) continue;
    changed++;
    if (col.type !== setting.type) {
      const [stored] = await loadStoredColumns(db, version.uploadId, [col.position]);
      try {
        col.summary = summarize(loadAs(stored, setting.type));
      } catch (error) {
        if (error instanceof ConversionProblem) throw badRequest(`columns.${i}.type: ${error.message}`, `columns.${i}.type`);
        throw error;
      }
    }
    const textLike = setting.type === 'identifier' || setting.type === 'text';
    col.type = setting.type;
    col.excluded = setting.excluded || textLike;
    col.overridden = col.type !== col.inferredType || col.excluded !== (col.inferredType === 'identifier' || col.inferredType === 'text');
  }
  if (changed === 0) throw badRequest('These settings are the same as the version\'s; no new version was made.', 'columns');
  const id = await db.transaction(async (tx) =>
    insertVersion(tx, {
      datasetId: version.datasetId,
      number: await nextVersionNumber(tx, version.datasetId),
      uploadId: version.uploadId,
      origin: 'column-settings',
      basedOn: version.number,
      columns,
      createdBy: scope.userId,
    }),
  );
  return versionSummary((await findVersionRowById(db, id))!);
}
