import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RequestReviewInput, ReviewDto } from '@shared/reviews';
import { api } from '@/lib/api';
import { reviewsKey } from './reviews';

/** POST .../fits/:fitId/reviews: the reviewers are e-mailed and notified. */
export function useRequestReview(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ fitId, ...input }: RequestReviewInput & { fitId: string }) => api.post<ReviewDto>(`/api/workspaces/${workspaceId}/fits/${fitId}/reviews`, input),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: reviewsKey(workspaceId) }),
  });
}
