import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReviewDetailDto } from '@shared/reviews';
import { api } from '@/lib/api';
import { reviewsKey, reviewsUrl } from './reviews';

/** GET /api/workspaces/:workspaceId/reviews/:reviewId (with comments and whether I may decide). */
export const reviewQueryOptions = (workspaceId: string, reviewId: string) =>
  queryOptions({ queryKey: [...reviewsKey(workspaceId), 'detail', reviewId], queryFn: () => api.get<ReviewDetailDto>(`${reviewsUrl(workspaceId)}/${reviewId}`) });

export const useReview = (workspaceId: string, reviewId: string) => useQuery(reviewQueryOptions(workspaceId, reviewId));
