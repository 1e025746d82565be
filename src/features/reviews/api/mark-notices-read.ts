import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { noticesKey } from './notices';

/** POST .../notices/read: all of mine, or the listed ones. */
export function useMarkNoticesRead(workspaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (ids?: string[]) => api.post<{ marked: number }>(`/api/workspaces/${workspaceId}/notices/read`, ids ? { ids } : {}),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: noticesKey(workspaceId) }),
  });
}
