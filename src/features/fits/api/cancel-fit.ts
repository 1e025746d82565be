import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FitSummaryDto } from '@shared/fits';
import { api } from '@/lib/api';
import { fitQueryOptions, fitUrl } from './fit';

/** POST .../fits/:fitId/cancel */
export function useCancelFit(workspaceId: string, fitId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<FitSummaryDto>(`${fitUrl(workspaceId, fitId)}/cancel`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: fitQueryOptions(workspaceId, fitId).queryKey }),
  });
}
