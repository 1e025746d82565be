import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetDto } from '@shared/datasets';
import { api } from '@/lib/api';

/**
 * GET /api/workspaces/:workspaceId/datasets, read here to offer datasets for a new model. The same
 * key as the datasets feature's own query, so both share one cache entry (features don't import each other).
 */
export const datasetOptionsQueryOptions = (workspaceId: string) =>
  queryOptions({
    queryKey: ['workspaces', workspaceId, 'datasets'],
    queryFn: () => api.get<{ datasets: DatasetDto[] }>(`/api/workspaces/${workspaceId}/datasets`),
  });

export const useDatasetOptions = (workspaceId: string) => useQuery(datasetOptionsQueryOptions(workspaceId));
