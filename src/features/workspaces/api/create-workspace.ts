import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateWorkspaceInput, WorkspaceDto } from '@shared/workspaces';
import { api } from '@/lib/api';
import { meQueryOptions } from '@/lib/session';
import { workspacesQueryOptions } from './workspaces';

/** POST /api/workspaces: a new workspace with its creator as admin. */
export async function createWorkspace(input: CreateWorkspaceInput): Promise<WorkspaceDto> {
  const body = await api.post<WorkspaceDto | { workspace: WorkspaceDto }>('/api/workspaces', input);
  return 'workspace' in body ? body.workspace : body;
}

export function useCreateWorkspace() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createWorkspace,
    onSuccess: async () => {
      // The memberships in /me feed the workspace switcher.
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: workspacesQueryOptions().queryKey }),
        queryClient.invalidateQueries({ queryKey: meQueryOptions().queryKey }),
      ]);
    },
  });
}
