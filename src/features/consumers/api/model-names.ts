import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ModelListItemDto } from '@shared/models';
import { api } from '@/lib/api';

/** GET /api/workspaces/:workspaceId/models, reduced to what the key and webhook forms offer. */
export async function getModelNames(workspaceId: string): Promise<{ id: string; name: string }[]> {
  const models = await api.get<ModelListItemDto[]>(`/api/workspaces/${workspaceId}/models`);
  return models.map((m) => ({ id: m.id, name: m.name }));
}

export const modelNamesQueryOptions = (workspaceId: string) =>
  queryOptions({ queryKey: ['workspaces', workspaceId, 'consumers', 'model-names'], queryFn: () => getModelNames(workspaceId) });

export const useModelNames = (workspaceId: string) => useQuery(modelNamesQueryOptions(workspaceId));
