import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MemberDto } from '@shared/members';
import { api, listFrom } from '@/lib/api';

/** GET /api/workspaces/:workspaceId/members */
export async function getMembers(workspaceId: string): Promise<MemberDto[]> {
  return listFrom<MemberDto>(await api.get(`/api/workspaces/${workspaceId}/members`), 'members');
}

export const membersQueryOptions = (workspaceId: string) =>
  queryOptions({ queryKey: ['workspaces', workspaceId, 'members'], queryFn: () => getMembers(workspaceId) });

export const useMembers = (workspaceId: string) => useQuery(membersQueryOptions(workspaceId));
