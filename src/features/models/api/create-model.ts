import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateModelInput, ModelListItemDto } from '@shared/models';
import { api } from '@/lib/api';
import { modelsQueryOptions } from './models';

/** POST /api/workspaces/:workspaceId/models */
export function useCreateModel(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateModelInput) => api.post<ModelListItemDto>(`/api/workspaces/${workspaceId}/models`, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: modelsQueryOptions(workspaceId).queryKey }),
  });
}
