import { queryOptions, useQuery } from '@tanstack/react-query';
import type { WebhookDto } from '@shared/consumers';
import { api } from '@/lib/api';

/** GET /api/workspaces/:workspaceId/webhooks (admins only; never the signing secrets). */
export const getWebhooks = (workspaceId: string) => api.get<WebhookDto[]>(`/api/workspaces/${workspaceId}/webhooks`);

export const webhooksQueryOptions = (workspaceId: string) =>
  queryOptions({ queryKey: ['workspaces', workspaceId, 'webhooks'], queryFn: () => getWebhooks(workspaceId) });

export const useWebhooks = (workspaceId: string) => useQuery(webhooksQueryOptions(workspaceId));
