import type { ItemRow } from '@shared/schemas/items';
import { DEFAULT_RULES, type CompanyRules } from '@shared/schemas/rules';
import { useItems } from '@/features/catalog/api/get-items';
import { useOrganization } from '@/features/organization/api/get-organization';
import { useRules } from '@/features/organization/api/get-rules';

/** What the booking editor needs from other features: active catalog items, the rules, the company's clock and currency. */
export function useEditorData() {
  const items = useItems({ active: 'true', sort: 'name', dir: 'asc', pageSize: 500 });
  const rules = useRules();
  const organization = useOrganization();
  return {
    ready: Boolean(items.data && rules.data && organization.data),
    error: items.error ?? rules.error ?? organization.error,
    items: (items.data?.data ?? []) as ItemRow[],
    // A role that sees no prices gets the planning rules only; its editor shows no prices and
    // works out no quote, so the defaults standing in for the rest are never read.
    rules: { ...DEFAULT_RULES, ...rules.data } as CompanyRules,
    timeZone: organization.data?.timeZone ?? 'UTC',
    currency: organization.data?.currency ?? 'USD',
  };
}
