import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateInvitationInput } from '@shared/members';
import { api } from '@/lib/api';
import { invitationsQueryOptions } from './invitations';

/** POST /api/workspaces/:workspaceId/invitations {email, role}: e-mails a link to join (admins). */
export const createInvitation = (workspaceId: string, input: CreateInvitationInput) =>
  api.post<unknown>(`/api/workspaces/${workspaceId}/invitations`, input);

export function useCreateInvitation(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateInvitationInput) => createInvitation(workspaceId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationsQueryOptions(workspaceId).queryKey }),
  });
}
