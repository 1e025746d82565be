import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeDto, SignInInput } from '@shared/auth';
import { api } from '@/lib/api';
import { meQueryOptions } from '@/lib/session';

/** POST /api/auth/sign-in: answers with the same body as /me. */
export const signIn = (input: SignInInput) => api.post<MeDto>('/api/auth/sign-in', input);

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (me) => {
      // A new person may be signing in on this browser: forget everything cached for the last one.
      queryClient.removeQueries();
      queryClient.setQueryData(meQueryOptions().queryKey, me);
    },
  });
}
