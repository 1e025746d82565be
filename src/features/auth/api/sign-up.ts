import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeDto, SignUpInput } from '@shared/auth';
import { api } from '@/lib/api';
import { meQueryOptions } from '@/lib/session';

/** POST /api/auth/sign-up: a new account and its own workspace (as admin); signs the person in. */
export const signUp = (input: SignUpInput) => api.post<MeDto>('/api/auth/sign-up', input);

export function useSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signUp,
    onSuccess: (me) => {
      queryClient.removeQueries();
      queryClient.setQueryData(meQueryOptions().queryKey, me);
    },
  });
}
