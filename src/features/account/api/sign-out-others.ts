import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { sessionsQueryOptions } from './sessions';

/** POST /api/auth/sessions/sign-out-others: ends every session but this one. */
export function signOutOthers(): Promise<{ signedOut: number }> {
  return api.post<{ signedOut: number }>('/api/auth/sessions/sign-out-others');
}

export function useSignOutOthers() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOutOthers,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sessionsQueryOptions().queryKey }),
  });
}
