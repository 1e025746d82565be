import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PublishReleaseInput, ReleaseDto } from '@shared/reviews';
import { api } from '@/lib/api';
import { releasesKey } from './releases';

/** POST .../models/:modelId/releases: an approved fit becomes the model's current release. */
export function usePublishRelease(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ modelId, ...input }: PublishReleaseInput & { modelId: string }) => api.post<ReleaseDto>(`/api/workspaces/${workspaceId}/models/${modelId}/releases`, input),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: releasesKey(workspaceId) }),
  });
}
