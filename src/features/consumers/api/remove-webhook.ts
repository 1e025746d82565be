import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { webhooksQueryOptions } from './webhooks';

/** DELETE /api/workspaces/:workspaceId/webhooks/:webhookId: no more deliveries; the history stays. */
export const removeWebhook = (workspaceId: string, webhookId: string) => api.delete<void>(`/api/workspaces/${workspaceId}/webhooks/${webhookId}`);

export function useRemoveWebhook(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (webhookId: string) => removeWebhook(workspaceId, webhookId),
    onSettled: () => queryClient.invalidateQueries({ queryKey: webhooksQueryOptions(workspaceId).queryKey }),
  });
}
