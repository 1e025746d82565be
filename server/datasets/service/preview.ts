/** A window of rows for the preview table: numbers stay numbers, missing cells are null. */
import { PREVIEW_ROW_LIMIT, type PreviewDto } from '../../../shared/datasets';
import type { Database } from '../../db/client';
import { loadColumnSlices } from '../data/uploads';
import { bytesToFloat64, bytesToInt32, decodeText } from '../storage/codec';
import type { StoredColumn } from '../storage/convert';
import { requireVersion } from './datasets';

function cells(c: StoredColumn, offset: number, limit: number): (string | number | null)[] {
  if (c.storage === 'float64') return Array.from(bytesToFloat64(c.data), (x) => (Number.isNaN(x) ? null : x));
  if (c.storage === 'codes') return Array.from(bytesToInt32(c.data), (k) => (k < 0 ? null : c.levels[k]));
  return decodeText(c.data).slice(offset, offset + limit);
}

export async function previewRows(
  db: Database,
  scope: { workspaceId: string; datasetId: string; number: number },
  offset: number,
  limit: number,
): Promise<PreviewDto> {
  const { version } = await requireVersion(db, scope.workspaceId, scope.datasetId, scope.number);
  const take = Math.max(0, Math.min(limit, PREVIEW_ROW_LIMIT, version.rowCount - offset));
  const columns = take > 0 ? (await loadColumnSlices(db, version.uploadId, offset, take)).map((c) => cells(c, offset, take)) : [];
  const rows = Array.from({ length: take }, (_, i) => columns.map((col) => col[i] ?? null));
  return { columns: version.columns.map((c) => c.name), offset, totalRows: version.rowCount, rows };
}
