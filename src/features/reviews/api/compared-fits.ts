import { useQueries } from '@tanstack/react-query';
import type { FitDetailDto } from '@shared/fits';
import { api } from '@/lib/api';

/** GET .../fits/:fitId for each compared fit (for the path charts); same keys as the fit page. */
export const useComparedFits = (workspaceId: string, fitIds: string[]) =>
  useQueries({
    queries: fitIds.map((fitId) => ({
      queryKey: ['workspaces', workspaceId, 'fits', 'detail', fitId],
      queryFn: () => api.get<FitDetailDto>(`/api/workspaces/${workspaceId}/fits/${fitId}`),
    })),
  });
