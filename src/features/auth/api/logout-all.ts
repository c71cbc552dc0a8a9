import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api';

/** Ends every session of the signed-in user, on every device ("Sign out everywhere"). */
export const logoutAll = () => api.post<void>('/api/auth/logout-all');

/** Like useLogout, the caller reloads the sign-in page on success. */
export const useLogoutAll = () => useMutation({ mutationFn: logoutAll });
