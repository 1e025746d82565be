import { queryOptions, useQuery } from '@tanstack/react-query';
import type { WorkspaceDto } from '@shared/workspaces';
import { api } from '@/lib/api';

/** GET /api/workspaces: the workspaces the signed-in person belongs to, with their role in each. */
export async function getWorkspaces(): Promise<WorkspaceDto[]> {
  const body = await api.get<WorkspaceDto[] | { workspaces: WorkspaceDto[] }>('/api/workspaces');
  return Array.isArray(body) ? body : body.workspaces;
}

export const workspacesQueryOptions = () => queryOptions({ queryKey: ['workspaces', 'list'], queryFn: getWorkspaces });

export const useWorkspaces = () => useQuery(workspacesQueryOptions());
