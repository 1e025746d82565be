import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { membersQueryOptions } from './members';

/** DELETE /api/workspaces/:workspaceId/members/:userId (admins) */
export const removeMember = (workspaceId: string, userId: string) => api.delete<void>(`/api/workspaces/${workspaceId}/members/${userId}`);

export function useRemoveMember(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) => removeMember(workspaceId, userId),
    onSettled: () => queryClient.invalidateQueries({ queryKey: membersQueryOptions(workspaceId).queryKey }),
  });
}
