import { useQuery } from '@tanstack/react-query';
import type { MailPreferencesDto } from '@shared/reviews';
import { api } from '@/lib/api';

export const mailPreferencesKey = ['me', 'mail-preferences'] as const;

/** GET /api/me/mail-preferences */
export const useMailPreferences = () => useQuery({ queryKey: mailPreferencesKey, queryFn: () => api.get<MailPreferencesDto>('/api/me/mail-preferences') });
