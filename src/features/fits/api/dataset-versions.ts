import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetDetailDto, DatasetDto } from '@shared/datasets';
import { api } from '@/lib/api';

export interface VersionOption {
  id: string;
  label: string;
}

/**
 * Every dataset version in the workspace, for "apply this fit to a table": GET .../datasets, then
 * GET .../datasets/:id for each dataset's versions. Newest versions first.
 */
export async function getVersionOptions(workspaceId: string): Promise<VersionOption[]> {
  const base = `/api/workspaces/${workspaceId}/datasets`;
  const { datasets } = await api.get<{ datasets: DatasetDto[] }>(base);
  const details = await Promise.all(datasets.map((d) => api.get<DatasetDetailDto>(`${base}/${d.id}`)));
  return details.flatMap((d) =>
    [...d.versions].sort((a, b) => b.number - a.number).map((v) => ({ id: v.id, label: `${d.name}, version ${v.number} (${v.fileName}, ${v.rowCount} rows)` })),
  );
}

export const versionOptionsQueryOptions = (workspaceId: string) =>
  queryOptions({ queryKey: ['workspaces', workspaceId, 'datasets', 'version-options'], queryFn: () => getVersionOptions(workspaceId) });

export const useVersionOptions = (workspaceId: string) => useQuery(versionOptionsQueryOptions(workspaceId));
