import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { meQueryOptions } from '@/lib/session';

/** POST /api/auth/sign-out */
export const signOut = () => api.post<void>('/api/auth/sign-out');

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSettled: () => {
      // Nothing of the signed-out person's data stays in memory.
      queryClient.removeQueries();
      queryClient.setQueryData(meQueryOptions().queryKey, null);
    },
  });
}
