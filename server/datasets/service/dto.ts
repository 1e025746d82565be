/** Database rows -> response shapes (rows never reach the client unshaped). */
import type { DatasetDetailDto, DatasetDto, VersionDetailDto, VersionSummaryDto } from '../../../shared/datasets';
import type { DatasetRow } from '../data/datasets';
import type { VersionRow } from '../data/versions';

const FORMER_MEMBER = 'a former member';

export function versionSummary(v: VersionRow): VersionSummaryDto {
  return {
    id: v.id,
    number: v.number,
    fileName: v.fileName,
    sha256: v.sha256,
    sizeBytes: v.sizeBytes,
    rowCount: v.rowCount,
    columnCount: v.columnCount,
    origin: v.origin,
    basedOn: v.basedOn,
    createdBy: { id: v.createdBy, name: v.createdByName ?? FORMER_MEMBER },
    createdAt: v.createdAt.toISOString(),
  };
}

export function versionDetail(v: VersionRow, datasetName: string): VersionDetailDto {
  return { ...versionSummary(v), datasetId: v.datasetId, datasetName, columns: v.columns, report: v.report };
}

export function datasetDetail(d: DatasetRow, versions: VersionRow[]): DatasetDetailDto {
  return {
    id: d.id,
    name: d.name,
    description: d.description,
    openKey: d.openKey,
    createdBy: { id: d.createdBy, name: d.createdByName ?? FORMER_MEMBER },
    createdAt: d.createdAt.toISOString(),
    versionCount: versions.length,
    versions: versions.map(versionSummary),
  };
}

export function datasetListItem(d: DatasetRow, versions: VersionRow[]): DatasetDto {
  const { versions: all, ...rest } = datasetDetail(d, versions);
  return { ...rest, latest: all[all.length - 1] };
}
