import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { datasetsQueryOptions } from './datasets';

/** DELETE /api/workspaces/:workspaceId/datasets/:datasetId (refused while fits depend on it) */
export function useDeleteDataset(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (datasetId: string) => api.delete<void>(`/api/workspaces/${workspaceId}/datasets/${datasetId}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: datasetsQueryOptions(workspaceId).queryKey }),
  });
}
