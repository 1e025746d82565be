import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DecideReviewInput, ReviewDetailDto } from '@shared/reviews';
import { api } from '@/lib/api';
import { reviewsKey, reviewsUrl } from './reviews';

/** POST .../reviews/:reviewId/decision: approve, or send back with reasons. */
export function useDecideReview(workspaceId: string, reviewId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: DecideReviewInput) => api.post<ReviewDetailDto>(`${reviewsUrl(workspaceId)}/${reviewId}/decision`, input),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: reviewsKey(workspaceId) }),
  });
}
