import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ModelListItemDto } from '@shared/models';
import { api, listFrom } from '@/lib/api';

/** GET /api/workspaces/:workspaceId/models */
export const getModels = async (workspaceId: string) =>
  listFrom(await api.get<ModelListItemDto[] | Record<string, unknown>>(`/api/workspaces/${workspaceId}/models`), 'models');

export const modelsQueryOptions = (workspaceId: string) =>
  queryOptions({ queryKey: ['workspaces', workspaceId, 'models'], queryFn: () => getModels(workspaceId) });

/** Polls every 2 s while any model's latest fit is still waiting or running, so statuses move on their own. */
export const useModels = (workspaceId: string) =>
  useQuery({
    ...modelsQueryOptions(workspaceId),
    refetchInterval: (q) => (q.state.data?.some((m) => m.latest && (m.latest.status === 'waiting' || m.latest.status === 'running')) ? 2000 : false),
  });
