import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PreviewDto } from '@shared/datasets';
import { api } from '@/lib/api';
import { versionQueryOptions, versionUrl } from './version';

/** GET .../versions/:number/rows?offset&limit: the first rows, for the preview table. */
export const previewQueryOptions = (workspaceId: string, datasetId: string, number: number, limit = 1000) =>
  queryOptions({
    queryKey: [...versionQueryOptions(workspaceId, datasetId, number).queryKey, 'rows', limit],
    queryFn: () => api.get<PreviewDto>(`${versionUrl(workspaceId, datasetId, number)}/rows?offset=0&limit=${limit}`),
    staleTime: Number.POSITIVE_INFINITY,
  });

export const usePreview = (workspaceId: string, datasetId: string, number: number) => useQuery(previewQueryOptions(workspaceId, datasetId, number));
