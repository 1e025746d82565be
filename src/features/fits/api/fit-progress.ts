import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FitProgressDto } from '@shared/fits';
import { api } from '@/lib/api';
import { fitQueryOptions, fitUrl } from './fit';

/** GET .../fits/:fitId/progress: light, polled every second while the fit waits or runs. */
export const fitProgressQueryOptions = (workspaceId: string, fitId: string) =>
  queryOptions({
    queryKey: [...fitQueryOptions(workspaceId, fitId).queryKey, 'progress'],
    queryFn: () => api.get<FitProgressDto>(`${fitUrl(workspaceId, fitId)}/progress`),
    staleTime: 0,
  });

export const useFitProgress = (workspaceId: string, fitId: string, active: boolean) =>
  useQuery({
    ...fitProgressQueryOptions(workspaceId, fitId),
    enabled: active,
    refetchInterval: (q) => (q.state.data && q.state.data.status !== 'waiting' && q.state.data.status !== 'running' ? false : 1000),
  });
