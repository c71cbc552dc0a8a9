import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { OrganizationResponse } from '@shared/schemas/organization';
import { uploadFile } from '@/lib/api';
import { organizationQueryOptions } from './get-organization';

export const LOGO_URL = '/api/organization/logo';

/**
 * The logo's address for an <img>. The server answers it with `no-cache`, but the version query
 * makes a replaced logo show at once instead of after the browser revalidates.
 */
export const logoUrl = (version: number) => `${LOGO_URL}?v=${version}`;

/** Replaces any logo on file. The server checks the content (PNG or JPEG; 1 MB). */
export const uploadLogo = ({ file, onProgress }: { file: File; onProgress?: (fraction: number) => void }) =>
  uploadFile<OrganizationResponse>('POST', LOGO_URL, file, { onProgress });

export function useUploadLogo() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadLogo,
    onSuccess: (organization) => queryClient.setQueryData(organizationQueryOptions().queryKey, organization),
  });
}
