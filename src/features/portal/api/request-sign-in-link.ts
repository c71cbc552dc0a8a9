import { useMutation } from '@tanstack/react-query';
import type { PortalSignInRequest } from '@shared/schemas/portal';
import { api } from '@/lib/api';

/**
 * Asks for a one-time sign-in link by e-mail. The server answers 202 whether or not it knows the
 * address, so the page says the same thing either way.
 */
export const requestSignInLink = (body: PortalSignInRequest) => api.post<void>('/api/portal/sign-in', body);

export const useRequestSignInLink = () => useMutation({ mutationFn: requestSignInLink });
