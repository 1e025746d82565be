import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetDto } from '@shared/datasets';
import { api } from '@/lib/api';

export interface DatasetList {
  datasets: DatasetDto[];
  uploadLimitBytes: number;
  columnLimit: number;
}

/** GET /api/workspaces/:workspaceId/datasets */
export const getDatasets = (workspaceId: string) => api.get<DatasetList>(`/api/workspaces/${workspaceId}/datasets`);

export const datasetsQueryOptions = (workspaceId: string) =>
  queryOptions({ queryKey: ['workspaces', workspaceId, 'datasets'], queryFn: () => getDatasets(workspaceId) });

export const useDatasets = (workspaceId: string) => useQuery(datasetsQueryOptions(workspaceId));
