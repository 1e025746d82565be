import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { invitationsQueryOptions } from './invitations';

/** DELETE /api/workspaces/:workspaceId/invitations/:invitationId: the link stops working (admins). */
export const revokeInvitation = (workspaceId: string, invitationId: string) =>
  api.delete<void>(`/api/workspaces/${workspaceId}/invitations/${invitationId}`);

export function useRevokeInvitation(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => revokeInvitation(workspaceId, invitationId),
    onSettled: () => queryClient.invalidateQueries({ queryKey: invitationsQueryOptions(workspaceId).queryKey }),
  });
}
