import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReleaseDto } from '@shared/reviews';
import { api } from '@/lib/api';

export const releasesKey = (workspaceId: string) => ['workspaces', workspaceId, 'releases'] as const;

/** GET /api/workspaces/:workspaceId/releases: every release, newest first, the current ones flagged. */
export const releasesQueryOptions = (workspaceId: string) =>
  queryOptions({ queryKey: releasesKey(workspaceId), queryFn: () => api.get<ReleaseDto[]>(`/api/workspaces/${workspaceId}/releases`) });

export const useReleases = (workspaceId: string) => useQuery(releasesQueryOptions(workspaceId));
