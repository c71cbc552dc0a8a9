import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { OrganizationResponse, UpdateOrganizationRequest } from '@shared/schemas/organization';
import { api } from '@/lib/api';
import { organizationQueryOptions } from './get-organization';

export const updateOrganization = (body: UpdateOrganizationRequest) => api.patch<OrganizationResponse>('/api/organization', body);

export function useUpdateOrganization() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateOrganization,
    onSuccess: (organization) => queryClient.setQueryData(organizationQueryOptions().queryKey, organization),
  });
}
