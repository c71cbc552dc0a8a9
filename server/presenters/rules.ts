import { PLANNING_RULE_KEYS, type CompanyRules, type PlanningRules } from '../../shared/schemas/rules';
import type { Organization, User } from '../models';
import { can } from '../policies';
import { rulesOf } from '../services/rules';

export type RulesAnswer = (CompanyRules | PlanningRules) & { can: { update: boolean; seePrices: boolean } };

/**
 * The company's rules as the reader may see them. Tax, deposit, fees, the damage waiver and the
 * billing settings are prices: whoever does not see a booking's prices (the crew) gets the planning
 * rules only, by the same rule as the booking presenter (`booking.seePrices`).
 */
export function presentRules(org: Organization, actor: User): RulesAnswer {
  const rules = rulesOf(org);
  const seePrices = can(actor, 'booking', 'seePrices');
  const shown = seePrices ? rules : (Object.fromEntries(PLANNING_RULE_KEYS.map((k) => [k, rules[k]])) as PlanningRules);
  return { ...shown, can: { update: can(actor, 'organization', 'update', org), seePrices } };
}
