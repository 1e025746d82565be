import { useQuery } from '@tanstack/react-query';
import type { FitDetailDto } from '@shared/fits';
import { api } from '@/lib/api';

/** GET /api/workspaces/:workspaceId/fits/:fitId: the fit under review (same key as the fit page's). */
export const useReviewedFit = (workspaceId: string, fitId: string | undefined) =>
  useQuery({
    queryKey: ['workspaces', workspaceId, 'fits', 'detail', fitId],
    queryFn: () => api.get<FitDetailDto>(`/api/workspaces/${workspaceId}/fits/${fitId}`),
    enabled: Boolean(fitId),
  });
