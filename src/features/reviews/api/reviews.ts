import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReviewDto, ReviewState } from '@shared/reviews';
import { api } from '@/lib/api';

export const reviewsUrl = (workspaceId: string) => `/api/workspaces/${workspaceId}/reviews`;
export const reviewsKey = (workspaceId: string) => ['workspaces', workspaceId, 'reviews'] as const;

/** GET /api/workspaces/:workspaceId/reviews[?state=] */
export const reviewsQueryOptions = (workspaceId: string, state?: ReviewState) =>
  queryOptions({
    queryKey: [...reviewsKey(workspaceId), 'list', state ?? 'all'],
    queryFn: () => api.get<ReviewDto[]>(`${reviewsUrl(workspaceId)}${state ? `?state=${state}` : ''}`),
  });

export const useReviews = (workspaceId: string, state?: ReviewState) => useQuery(reviewsQueryOptions(workspaceId, state));
