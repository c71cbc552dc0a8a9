import { useMutation } from '@tanstack/react-query';
import type { PortalSignStart } from '@shared/schemas/portal';
import { api } from '@/lib/api';

/**
 * Opens a signing link for the booking's current agreement and answers the signing page's address
 * (a POST: making a link is a change). The caller goes there with `window.location.assign`.
 */
export const startSigning = (signUrl: string) => api.post<PortalSignStart>(signUrl, {});

export const useStartSigning = () => useMutation({ mutationFn: startSigning });
