import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FitDetailDto } from '@shared/fits';
import { api } from '@/lib/api';

/**
 * GET /api/workspaces/:workspaceId/fits/:fitId, read here for its spec ("run again with changes").
 * The same key as the fits feature's own query, so the two share a cache entry.
 */
export const fitSpecQueryOptions = (workspaceId: string, fitId: string) =>
  queryOptions({ queryKey: ['workspaces', workspaceId, 'fits', 'detail', fitId], queryFn: () => api.get<FitDetailDto>(`/api/workspaces/${workspaceId}/fits/${fitId}`) });

export const useFitSpec = (workspaceId: string, fitId: string | null) => useQuery({ ...fitSpecQueryOptions(workspaceId, fitId ?? ''), enabled: Boolean(fitId) });
