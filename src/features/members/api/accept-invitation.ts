import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { UserDto, acceptInvitationSchema } from '@shared/auth';
import type { WorkspaceRole } from '@shared/members';
import { api } from '@/lib/api';
import { meQueryOptions } from '@/lib/session';

export type AcceptInvitationInput = z.input<typeof acceptInvitationSchema>;

export interface AcceptInvitationResult {
  user: UserDto;
  workspaceId: string;
  role: WorkspaceRole;
}

/**
 * POST /api/invitations/:token/accept: a new person sends a name and password and is signed in;
 * someone already signed in sends nothing.
 */
export const acceptInvitation = (token: string, input: AcceptInvitationInput) =>
  api.post<AcceptInvitationResult>(`/api/invitations/${encodeURIComponent(token)}/accept`, input);

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AcceptInvitationInput) => acceptInvitation(token, input),
    // The new membership (and, for a new person, the new session) shows up in /me; mutateAsync
    // resolves only after this refetch, so the workspace page finds the membership at once.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meQueryOptions().queryKey }),
  });
}
