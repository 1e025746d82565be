import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import type { passwordResetCompleteSchema } from '@shared/auth';
import { api } from '@/lib/api';

export type PasswordResetCompleteInput = z.input<typeof passwordResetCompleteSchema>;

/** POST /api/auth/password-reset/complete: sets the new password from the e-mailed token. */
export const completePasswordReset = (input: PasswordResetCompleteInput) => api.post<void>('/api/auth/password-reset/complete', input);

export const useCompletePasswordReset = () => useMutation({ mutationFn: completePasswordReset });
