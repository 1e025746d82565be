import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreatedKeyDto, CreateKeyInput } from '@shared/consumers';
import { api } from '@/lib/api';
import { keysQueryOptions } from './keys';

/** POST /api/workspaces/:workspaceId/keys: the answer is the only time the key is shown. */
export const createKey = (workspaceId: string, input: CreateKeyInput) => api.post<CreatedKeyDto>(`/api/workspaces/${workspaceId}/keys`, input);

export function useCreateKey(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateKeyInput) => createKey(workspaceId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: keysQueryOptions(workspaceId).queryKey }),
  });
}
