import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreatedWebhookDto, CreateWebhookInput } from '@shared/consumers';
import { api } from '@/lib/api';
import { webhooksQueryOptions } from './webhooks';

/** POST /api/workspaces/:workspaceId/webhooks: the answer is the only time the signing secret is shown. */
export const createWebhook = (workspaceId: string, input: CreateWebhookInput) =>
  api.post<CreatedWebhookDto>(`/api/workspaces/${workspaceId}/webhooks`, input);

export function useCreateWebhook(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateWebhookInput) => createWebhook(workspaceId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: webhooksQueryOptions(workspaceId).queryKey }),
  });
}
