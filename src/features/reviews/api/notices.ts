import { useQuery } from '@tanstack/react-query';
import type { NoticeDto } from '@shared/reviews';
import { api } from '@/lib/api';

export const noticesKey = (workspaceId: string) => ['workspaces', workspaceId, 'notices'] as const;

/** GET .../notices: mine in this workspace, newest first (checked every 30 s). */
export const useNotices = (workspaceId: string) =>
  useQuery({ queryKey: noticesKey(workspaceId), queryFn: () => api.get<NoticeDto[]>(`/api/workspaces/${workspaceId}/notices`), refetchInterval: 30_000 });
