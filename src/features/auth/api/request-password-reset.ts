import { useMutation } from '@tanstack/react-query';
import type { PasswordResetRequest } from '@shared/schemas/auth';
import { api } from '@/lib/api';

/** Always answered 202, whether or not the address has an account. */
export const requestPasswordReset = (body: PasswordResetRequest) => api.post<void>('/api/auth/password-reset/request', body);

export const useRequestPasswordReset = () => useMutation({ mutationFn: requestPasswordReset });
