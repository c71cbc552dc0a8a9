import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OrganizationResponse } from '@shared/schemas/organization';
import { api } from '@/lib/api';

export const getOrganization = (signal?: AbortSignal) => api.get<OrganizationResponse>('/api/organization', { signal });

export const organizationQueryOptions = () =>
  queryOptions({
    queryKey: ['organization'] as const,
    queryFn: ({ signal }) => getOrganization(signal),
  });

export const useOrganization = () => useQuery(organizationQueryOptions());
