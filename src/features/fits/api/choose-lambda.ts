import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChooseLambdaInput, FitDetailDto } from '@shared/fits';
import { api } from '@/lib/api';
import { fitQueryOptions, fitUrl } from './fit';

/** POST .../fits/:fitId/choice: stores the lambda this version reports (a rule or any position). */
export function useChooseLambda(workspaceId: string, fitId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ChooseLambdaInput) => api.post<FitDetailDto>(`${fitUrl(workspaceId, fitId)}/choice`, input),
    onSuccess: (fit) => {
      queryClient.setQueryData(fitQueryOptions(workspaceId, fitId).queryKey, fit);
      // The model's version list shows the chosen lambda's metrics; it lives in the models feature,
      // so it is refreshed by its workspace-level key rather than imported query options.
      void queryClient.invalidateQueries({ queryKey: ['workspaces', workspaceId, 'models'] });
    },
  });
}
