import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { OrganizationResponse } from '@shared/schemas/organization';
import { api } from '@/lib/api';
import { organizationQueryOptions } from './get-organization';
import { LOGO_URL } from './upload-logo';

/** Documents issued from now on print no logo; ones already issued keep theirs. */
export const deleteLogo = () => api.delete<OrganizationResponse>(LOGO_URL);

export function useDeleteLogo() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteLogo,
    onSuccess: (organization) => queryClient.setQueryData(organizationQueryOptions().queryKey, organization),
  });
}
