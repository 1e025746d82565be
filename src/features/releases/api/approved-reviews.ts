import { useQuery } from '@tanstack/react-query';
import type { ReviewDto } from '@shared/reviews';
import { api } from '@/lib/api';

/** GET .../reviews?state=approved: the fits that may be released. */
export const useApprovedReviews = (workspaceId: string) =>
  useQuery({
    queryKey: ['workspaces', workspaceId, 'reviews', 'list', 'approved'],
    queryFn: () => api.get<ReviewDto[]>(`/api/workspaces/${workspaceId}/reviews?state=approved`),
  });
