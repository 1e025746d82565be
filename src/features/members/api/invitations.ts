import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationDto } from '@shared/members';
import { api, listFrom } from '@/lib/api';

/** GET /api/workspaces/:workspaceId/invitations: pending invitations (admins only). */
export async function getInvitations(workspaceId: string): Promise<InvitationDto[]> {
  return listFrom<InvitationDto>(await api.get(`/api/workspaces/${workspaceId}/invitations`), 'invitations');
}

export const invitationsQueryOptions = (workspaceId: string) =>
  queryOptions({ queryKey: ['workspaces', workspaceId, 'invitations'], queryFn: () => getInvitations(workspaceId) });

export const useInvitations = (workspaceId: string, enabled = true) => useQuery({ ...invitationsQueryOptions(workspaceId), enabled });
