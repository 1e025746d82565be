import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { WorkspaceRole } from '@shared/members';
import { api } from '@/lib/api';
import { membersQueryOptions } from './members';

interface ChangeRoleArgs {
  workspaceId: string;
  userId: string;
  role: WorkspaceRole;
}

/** PATCH /api/workspaces/:workspaceId/members/:userId {role} (admins) */
export const changeMemberRole = ({ workspaceId, userId, role }: ChangeRoleArgs) =>
  api.patch<unknown>(`/api/workspaces/${workspaceId}/members/${userId}`, { role });

export function useChangeMemberRole(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (args: Omit<ChangeRoleArgs, 'workspaceId'>) => changeMemberRole({ workspaceId, ...args }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: membersQueryOptions(workspaceId).queryKey }),
  });
}
