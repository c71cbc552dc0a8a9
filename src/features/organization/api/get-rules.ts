import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CompanyRules, PlanningRules } from '@shared/schemas/rules';
import { api } from '@/lib/api';

type RulesCan = { can: { update: boolean; seePrices: boolean } };
/** Every rule, prices included: what a role that sees prices reads. */
export type RulesResponse = CompanyRules & RulesCan;
/** What the server answers: the planning rules only for a role that sees no prices (`can.seePrices` false). */
export type RulesAnswer = RulesResponse | (PlanningRules & RulesCan);

export const hasPriceRules = (rules: RulesAnswer): rules is RulesResponse => rules.can.seePrices;

/** The company's pricing and planning rules (every role reads them, the crew without the prices; the owner changes them). */
export const getRules = (signal?: AbortSignal) => api.get<RulesAnswer>('/api/organization/rules', { signal });

export const rulesQueryOptions = () =>
  queryOptions({
    queryKey: ['organization', 'rules'] as const,
    queryFn: ({ signal }) => getRules(signal),
  });

export const useRules = () => useQuery(rulesQueryOptions());
