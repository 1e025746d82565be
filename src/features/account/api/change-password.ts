import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChangePasswordInput } from '@shared/auth';
import { api } from '@/lib/api';
import { sessionsQueryOptions } from './sessions';

/** POST /api/auth/password: needs the current password; other sessions end. */
export function changePassword(input: ChangePasswordInput): Promise<{ signedOut: number; message: string }> {
  return api.post<{ signedOut: number; message: string }>('/api/auth/password', input);
}

export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changePassword,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sessionsQueryOptions().queryKey }),
  });
}
