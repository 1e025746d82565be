import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReviewDetailDto } from '@shared/reviews';
import { api } from '@/lib/api';
import { reviewsKey, reviewsUrl } from './reviews';

/** POST .../reviews/:reviewId/withdraw (the requester or an admin). */
export function useWithdrawReview(workspaceId: string, reviewId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<ReviewDetailDto>(`${reviewsUrl(workspaceId)}/${reviewId}/withdraw`, {}),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: reviewsKey(workspaceId) }),
  });
}
