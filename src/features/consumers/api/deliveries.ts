import { queryOptions, useQuery } from '@tanstack/react-query';
import type { WebhookDeliveryDto } from '@shared/consumers';
import { api } from '@/lib/api';
import { webhooksQueryOptions } from './webhooks';

/** GET /api/workspaces/:workspaceId/webhooks/:webhookId/deliveries: the latest 100, newest first, each try listed. */
export const getDeliveries = (workspaceId: string, webhookId: string) =>
  api.get<WebhookDeliveryDto[]>(`/api/workspaces/${workspaceId}/webhooks/${webhookId}/deliveries`);

export const deliveriesQueryOptions = (workspaceId: string, webhookId: string) =>
  queryOptions({ queryKey: [...webhooksQueryOptions(workspaceId).queryKey, webhookId, 'deliveries'], queryFn: () => getDeliveries(workspaceId, webhookId) });

/** Polls while a delivery is still being tried. */
export const useDeliveries = (workspaceId: string, webhookId: string) =>
  useQuery({ ...deliveriesQueryOptions(workspaceId, webhookId), refetchInterval: (q) => (q.state.data?.some((d) => d.state === 'pending') ? 3000 : false) });
