import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, listFrom } from '@/lib/api';

/** One e-mail captured by the local fake SMTP server (development and test only). */
export interface OutboxMessage {
  id: number;
  to: string[];
  subject: string;
  text: string;
  receivedAt: string;
}

/** GET /api/dev/outbox: your own captured mail; absent (404) unless the server turned it on. */
export async function getOutbox(): Promise<OutboxMessage[]> {
  return listFrom<OutboxMessage>(await api.get('/api/dev/outbox'), 'messages');
}

export const outboxQueryOptions = () => queryOptions({ queryKey: ['dev', 'outbox'], queryFn: getOutbox, staleTime: 0 });

export const useOutbox = (enabled = true) => useQuery({ ...outboxQueryOptions(), enabled });
