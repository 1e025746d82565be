import { queryOptions, useQuery } from '@tanstack/react-query';
import { ACTIVE_FIT_STATUSES, type FitDetailDto } from '@shared/fits';
import { api } from '@/lib/api';

export const fitUrl = (workspaceId: string, fitId: string) => `/api/workspaces/${workspaceId}/fits/${fitId}`;

/** GET /api/workspaces/:workspaceId/fits/:fitId */
export const getFit = (workspaceId: string, fitId: string) => api.get<FitDetailDto>(fitUrl(workspaceId, fitId));

export const fitQueryOptions = (workspaceId: string, fitId: string) =>
  queryOptions({ queryKey: ['workspaces', workspaceId, 'fits', 'detail', fitId], queryFn: () => getFit(workspaceId, fitId), staleTime: 0 });

/**
 * The fit with its results. While the evaluation at a newly chosen lambda is being computed by a
 * worker (state 'waiting'), poll until it is ready.
 */
export const useFit = (workspaceId: string, fitId: string) =>
  useQuery({
    ...fitQueryOptions(workspaceId, fitId),
    refetchInterval: (q) => {
      const d = q.state.data;
      if (!d) return false;
      if (ACTIVE_FIT_STATUSES.includes(d.status)) return 3000;
      return d.results?.evaluation.state === 'waiting' ? 1000 : false;
    },
  });
