import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CompanyRules } from '@shared/schemas/rules';
import { api } from '@/lib/api';

export type RulesResponse = CompanyRules & { can: { update: boolean } };

/** The company's pricing and planning rules (every role reads them; the owner changes them). */
export const getRules = (signal?: AbortSignal) => api.get<RulesResponse>('/api/organization/rules', { signal });

export const rulesQueryOptions = () =>
  queryOptions({
    queryKey: ['organization', 'rules'] as const,
    queryFn: ({ signal }) => getRules(signal),
  });

export const useRules = () => useQuery(rulesQueryOptions());
