import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionDto } from '@shared/auth';
import { api, listFrom } from '@/lib/api';

/** GET /api/auth/sessions: the signed-in person's live sessions, newest first. */
export async function getSessions(): Promise<SessionDto[]> {
  return listFrom<SessionDto>(await api.get('/api/auth/sessions'), 'sessions');
}

export const sessionsQueryOptions = () => queryOptions({ queryKey: ['auth', 'sessions'], queryFn: getSessions });

export const useSessions = () => useQuery(sessionsQueryOptions());
