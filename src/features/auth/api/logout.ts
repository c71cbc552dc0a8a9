import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api';

export const logout = () => api.post<void>('/api/auth/logout');

/**
 * The caller loads the sign-in page afresh on success, which drops every cached answer of the
 * signed-out user from memory (shared office computers).
 */
export const useLogout = () => useMutation({ mutationFn: logout });
