import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApiKeyDto } from '@shared/consumers';
import { api } from '@/lib/api';
import { keysQueryOptions } from './keys';

/** POST /api/workspaces/:workspaceId/keys/:keyId/revoke: the key stops working at once. */
export const revokeKey = (workspaceId: string, keyId: string) => api.post<ApiKeyDto>(`/api/workspaces/${workspaceId}/keys/${keyId}/revoke`);

export function useRevokeKey(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (keyId: string) => revokeKey(workspaceId, keyId),
    onSettled: () => queryClient.invalidateQueries({ queryKey: keysQueryOptions(workspaceId).queryKey }),
  });
}
