import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetDetailDto, VersionDetailDto } from '@shared/datasets';
import { api } from '@/lib/api';

/**
 * The latest version of a dataset with its columns (for the outcome choice and the predictor picker):
 * GET .../datasets/:datasetId, then GET .../datasets/:datasetId/versions/:number.
 */
export async function getLatestVersion(workspaceId: string, datasetId: string): Promise<VersionDetailDto> {
  const base = `/api/workspaces/${workspaceId}/datasets/${datasetId}`;
  const dataset = await api.get<DatasetDetailDto>(base);
  const latest = Math.max(...dataset.versions.map((v) => v.number));
  return api.get<VersionDetailDto>(`${base}/versions/${latest}`);
}

export const latestVersionQueryOptions = (workspaceId: string, datasetId: string) =>
  queryOptions({ queryKey: ['workspaces', workspaceId, 'datasets', 'detail', datasetId, 'latest-version'], queryFn: () => getLatestVersion(workspaceId, datasetId), staleTime: 0 });

export const useLatestVersion = (workspaceId: string, datasetId: string | undefined) =>
  useQuery({ ...latestVersionQueryOptions(workspaceId, datasetId ?? ''), enabled: Boolean(datasetId) });
