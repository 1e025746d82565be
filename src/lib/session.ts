/** The session is shared by every feature and the app shell, so its query lives here rather than in one feature. */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeDto } from '@shared/auth';
import { api, isApiError } from '@/lib/api';

/** GET /api/auth/me: the signed-in person, their workspaces and roles; null when signed out (401). */
export async function getMe(): Promise<MeDto | null> {
  try {
    return await api.get<MeDto>('/api/auth/me');
  } catch (error) {
    if (isApiError(error, 401)) return null;
    throw error;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: ['auth', 'me'], queryFn: getMe, staleTime: 60_000 });

export const useMe = () => useQuery(meQueryOptions());
