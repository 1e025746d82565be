import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetDetailDto } from '@shared/datasets';
import { api } from '@/lib/api';
import { datasetsQueryOptions } from './datasets';

/** GET /api/workspaces/:workspaceId/datasets/:datasetId */
export const getDataset = (workspaceId: string, datasetId: string) => api.get<DatasetDetailDto>(`/api/workspaces/${workspaceId}/datasets/${datasetId}`);

export const datasetQueryOptions = (workspaceId: string, datasetId: string) =>
  queryOptions({ queryKey: [...datasetsQueryOptions(workspaceId).queryKey, 'detail', datasetId], queryFn: () => getDataset(workspaceId, datasetId) });

export const useDataset = (workspaceId: string, datasetId: string) => useQuery(datasetQueryOptions(workspaceId, datasetId));
