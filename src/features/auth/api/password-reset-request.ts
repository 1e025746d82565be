import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import type { passwordResetRequestSchema } from '@shared/auth';
import { api } from '@/lib/api';

export type PasswordResetRequestInput = z.input<typeof passwordResetRequestSchema>;

/** POST /api/auth/password-reset/request: always accepted, so nobody can probe which e-mails exist. */
export const requestPasswordReset = (input: PasswordResetRequestInput) => api.post<void>('/api/auth/password-reset/request', input);

export const useRequestPasswordReset = () => useMutation({ mutationFn: requestPasswordReset });
