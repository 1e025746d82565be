import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeDto } from '@shared/auth';
import { api } from '@/lib/api';
import { meQueryOptions } from '@/lib/session';

/** POST /api/auth/sign-up/complete: the e-mailed token creates the account and its workspace, and signs the person in. */
export const completeSignUp = (token: string) => api.post<MeDto>('/api/auth/sign-up/complete', { token });

export function useCompleteSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: completeSignUp,
    onSuccess: (me) => {
      queryClient.removeQueries();
      queryClient.setQueryData(meQueryOptions().queryKey, me);
    },
  });
}
