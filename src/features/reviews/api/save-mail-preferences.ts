import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MailPreferencesDto } from '@shared/reviews';
import { apiRequest } from '@/lib/api';
import { mailPreferencesKey } from './mail-preferences';

/** PUT /api/me/mail-preferences (every switch named). */
export function useSaveMailPreferences() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: MailPreferencesDto) => apiRequest<MailPreferencesDto>('PUT', '/api/me/mail-preferences', input),
    onSuccess: (saved) => queryClient.setQueryData(mailPreferencesKey, saved),
  });
}
