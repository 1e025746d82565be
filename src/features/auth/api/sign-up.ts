import { useMutation } from '@tanstack/react-query';
import type { SignUpInput } from '@shared/auth';
import { api } from '@/lib/api';

/**
 * POST /api/auth/sign-up: always "check your inbox" (202), whether or not the address has an
 * account; the e-mailed link finishes the sign-up (sign-up-complete.ts).
 */
export const signUp = (input: SignUpInput) => api.post<{ message: string }>('/api/auth/sign-up', input);

export const useSignUp = () => useMutation({ mutationFn: signUp });
