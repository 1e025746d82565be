/** Reading and deleting datasets and versions; every lookup is scoped to the caller's workspace. */
import type { DatasetDetailDto, DatasetDto, VersionDetailDto } from '../../../shared/datasets';
import type { Database } from '../../db/client';
import { conflict, notFound } from '../../http/errors';
import { deleteDatasetRow, findDataset, listDatasetRows, type DatasetRow } from '../data/datasets';
import { findVersionRow, listVersionRows, type VersionRow } from '../data/versions';
import { findDependents } from './dependents';
import { datasetDetail, datasetListItem, versionDetail } from './dto';

export async function listDatasets(db: Database, workspaceId: string): Promise<DatasetDto[]> {
  const rows = await listDatasetRows(db, workspaceId);
  const versions = await listVersionRows(
    db,
    rows.map((r) => r.id),
  );
  return rows.filter((d) => versions.some((v) => v.datasetId === d.id)).map((d) => datasetListItem(d, versions.filter((v) => v.datasetId === d.id)));
}

export async function requireDataset(db: Database, workspaceId: string, datasetId: string): Promise<DatasetRow> {
  const dataset = await findDataset(db, workspaceId, datasetId);
  if (!dataset) throw notFound('No such dataset in this workspace.');
  return dataset;
}

export async function getDataset(db: Database, workspaceId: string, datasetId: string): Promise<DatasetDetailDto> {
  const dataset = await requireDataset(db, workspaceId, datasetId);
  return datasetDetail(dataset, await listVersionRows(db, [dataset.id]));
}

export async function requireVersion(db: Database, workspaceId: string, datasetId: string, number: number): Promise<{ dataset: DatasetRow; version: VersionRow }> {
  const dataset = await requireDataset(db, workspaceId, datasetId);
  const version = await findVersionRow(db, dataset.id, number);
  if (!version) throw notFound(`Dataset "${dataset.name}" has no version ${number}.`);
  return { dataset, version };
}

export async function getVersion(db: Database, workspaceId: string, datasetId: string, number: number): Promise<VersionDetailDto> {
  const { dataset, version } = await requireVersion(db, workspaceId, datasetId, number);
  return versionDetail(version, dataset.name);
}

/** Deletes a dataset with all its versions, unless something (a fit) depends on it. */
export async function deleteDataset(db: Database, workspaceId: string, datasetId: string): Promise<void> {
  const dataset = await requireDataset(db, workspaceId, datasetId);
  const dependents = await findDependents(db, dataset.id);
  if (dependents.length > 0) {
    throw conflict(`"${dataset.name}" cannot be deleted because other work depends on it: ${dependents.join('; ')}. Delete those first.`, 'datasetId');
  }
  await deleteDatasetRow(db, dataset.id);
}
