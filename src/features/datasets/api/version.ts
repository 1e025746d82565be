import { queryOptions, useQuery } from '@tanstack/react-query';
import type { VersionDetailDto } from '@shared/datasets';
import { api } from '@/lib/api';
import { datasetQueryOptions } from './dataset';

export const versionUrl = (workspaceId: string, datasetId: string, number: number) => `/api/workspaces/${workspaceId}/datasets/${datasetId}/versions/${number}`;

/** GET /api/workspaces/:workspaceId/datasets/:datasetId/versions/:number (immutable: never stale) */
export const versionQueryOptions = (workspaceId: string, datasetId: string, number: number) =>
  queryOptions({
    queryKey: [...datasetQueryOptions(workspaceId, datasetId).queryKey, 'versions', number],
    queryFn: () => api.get<VersionDetailDto>(versionUrl(workspaceId, datasetId, number)),
    staleTime: Number.POSITIVE_INFINITY,
  });

export const useVersion = (workspaceId: string, datasetId: string, number: number) => useQuery(versionQueryOptions(workspaceId, datasetId, number));
