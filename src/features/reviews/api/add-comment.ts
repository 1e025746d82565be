import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AddCommentInput, ReviewDetailDto } from '@shared/reviews';
import { api } from '@/lib/api';
import { reviewQueryOptions } from './review';
import { reviewsUrl } from './reviews';

/** POST .../reviews/:reviewId/comments: on the fit (no term) or one coefficient. */
export function useAddComment(workspaceId: string, reviewId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AddCommentInput) => api.post<ReviewDetailDto>(`${reviewsUrl(workspaceId)}/${reviewId}/comments`, input),
    onSuccess: (review) => queryClient.setQueryData(reviewQueryOptions(workspaceId, reviewId).queryKey, review),
  });
}
