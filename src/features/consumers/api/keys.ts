import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ApiKeyDto } from '@shared/consumers';
import { api } from '@/lib/api';

/** GET /api/workspaces/:workspaceId/keys: the workspace's consumer API keys (admins only; never the keys themselves). */
export const getKeys = (workspaceId: string) => api.get<ApiKeyDto[]>(`/api/workspaces/${workspaceId}/keys`);

export const keysQueryOptions = (workspaceId: string) => queryOptions({ queryKey: ['workspaces', workspaceId, 'keys'], queryFn: () => getKeys(workspaceId) });

export const useKeys = (workspaceId: string) => useQuery(keysQueryOptions(workspaceId));
