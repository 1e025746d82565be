import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { MeDto, acceptInvitationSchema } from '@shared/auth';
import { api } from '@/lib/api';
import { meQueryOptions } from '@/lib/session';

export type AcceptInvitationInput = z.input<typeof acceptInvitationSchema>;

/**
 * POST /api/invitations/:token/accept: a new person sends a name and password and is signed in;
 * someone already signed in sends nothing.
 */
export const acceptInvitation = (token: string, input: AcceptInvitationInput) =>
  api.post<MeDto | undefined>(`/api/invitations/${encodeURIComponent(token)}/accept`, input);

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AcceptInvitationInput) => acceptInvitation(token, input),
    // The new membership (and, for a new person, the new session) shows up in /me.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meQueryOptions().queryKey }),
  });
}
