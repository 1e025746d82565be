import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FitRequestInput, FitSummaryDto } from '@shared/fits';
import { api } from '@/lib/api';
import { modelsQueryOptions } from './models';

/** POST /api/workspaces/:workspaceId/models/:modelId/fits: queues the next version (202, status waiting). */
export function useRunFit(workspaceId: string, modelId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: FitRequestInput) => api.post<FitSummaryDto>(`/api/workspaces/${workspaceId}/models/${modelId}/fits`, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: modelsQueryOptions(workspaceId).queryKey }),
  });
}
