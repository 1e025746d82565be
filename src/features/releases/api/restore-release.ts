import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReleaseDto, RestoreReleaseInput } from '@shared/reviews';
import { api } from '@/lib/api';
import { releasesKey } from './releases';

/** POST .../releases/:releaseId/restore: a new release that brings back an earlier one's fit and lambda. */
export function useRestoreRelease(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ releaseId, ...input }: RestoreReleaseInput & { releaseId: string }) => api.post<ReleaseDto>(`/api/workspaces/${workspaceId}/releases/${releaseId}/restore`, input),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: releasesKey(workspaceId) }),
  });
}
