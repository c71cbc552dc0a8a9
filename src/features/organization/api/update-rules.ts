import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CompanyRules } from '@shared/schemas/rules';
import { api } from '@/lib/api';
import { rulesQueryOptions, type RulesResponse } from './get-rules';

/** PUT takes every rule, not a patch. */
export const updateRules = (body: CompanyRules) => api.put<RulesResponse>('/api/organization/rules', body);

export function useUpdateRules() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateRules,
    onSuccess: (rules) => queryClient.setQueryData(rulesQueryOptions().queryKey, rules),
  });
}
