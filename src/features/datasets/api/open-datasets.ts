import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { OpenDatasetDto } from '@shared/datasets';
import { api } from '@/lib/api';
import { datasetsQueryOptions } from './datasets';

/** GET /api/workspaces/:workspaceId/open-datasets */
export const openDatasetsQueryOptions = (workspaceId: string) =>
  queryOptions({
    queryKey: [...datasetsQueryOptions(workspaceId).queryKey, 'open'],
    queryFn: async () => (await api.get<{ openDatasets: OpenDatasetDto[] }>(`/api/workspaces/${workspaceId}/open-datasets`)).openDatasets,
  });

export const useOpenDatasets = (workspaceId: string) => useQuery(openDatasetsQueryOptions(workspaceId));

/** POST /api/workspaces/:workspaceId/open-datasets/:key/import */
export function useImportOpenDataset(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (key: string) => api.post<{ datasetId: string; versionId: string; duplicate: boolean }>(`/api/workspaces/${workspaceId}/open-datasets/${key}/import`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: datasetsQueryOptions(workspaceId).queryKey }),
  });
}
