import { useMutation } from '@tanstack/react-query';
import type { PasswordResetConfirm } from '@shared/schemas/auth';
import { api } from '@/lib/api';

export const confirmPasswordReset = (body: PasswordResetConfirm) => api.post<void>('/api/auth/password-reset/confirm', body);

export const useConfirmPasswordReset = () => useMutation({ mutationFn: confirmPasswordReset });
