import { useQuery } from '@tanstack/react-query';
import type { ModelDetailDto, ModelListItemDto } from '@shared/models';
import { api } from '@/lib/api';

/** GET .../models: to pick a fit to review or compare. */
export const useModelList = (workspaceId: string) =>
  useQuery({ queryKey: ['workspaces', workspaceId, 'models', 'list'], queryFn: () => api.get<ModelListItemDto[]>(`/api/workspaces/${workspaceId}/models`) });

/** GET .../models/:modelId: its versions. */
export const useModelVersions = (workspaceId: string, modelId: string) =>
  useQuery({
    queryKey: ['workspaces', workspaceId, 'models', 'detail', modelId],
    queryFn: () => api.get<ModelDetailDto>(`/api/workspaces/${workspaceId}/models/${modelId}`),
    enabled: Boolean(modelId),
  });
