import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ModelDetailDto } from '@shared/models';
import { api } from '@/lib/api';
import { modelsQueryOptions } from './models';

/** GET /api/workspaces/:workspaceId/models/:modelId (versions newest first, with key metrics) */
export const getModel = (workspaceId: string, modelId: string) => api.get<ModelDetailDto>(`/api/workspaces/${workspaceId}/models/${modelId}`);

export const modelQueryOptions = (workspaceId: string, modelId: string) =>
  queryOptions({ queryKey: [...modelsQueryOptions(workspaceId).queryKey, 'detail', modelId], queryFn: () => getModel(workspaceId, modelId), staleTime: 0 });

export const useModel = (workspaceId: string, modelId: string) =>
  useQuery({
    ...modelQueryOptions(workspaceId, modelId),
    refetchInterval: (q) => (q.state.data?.versions.some((v) => v.status === 'waiting' || v.status === 'running') ? 2000 : false),
  });
