import { CompanyRules, DEFAULT_RULES } from '../../shared/schemas/rules';
import type { Organization } from '../models';

/** The company's rules with defaults filled in for anything it has not set. */
export function rulesOf(org: Organization): CompanyRules {
  const parsed = CompanyRules.safeParse({ ...DEFAULT_RULES, ...(org.rules ?? {}) });
  return parsed.success ? parsed.data : DEFAULT_RULES;
}

/** YYYY-MM-DD of an instant in the company's time zone. */
export function localDate(instant: Date, timeZone: string): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(instant);
}
