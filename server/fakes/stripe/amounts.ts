import { formatMoney } from '../../../shared/money';
import { invalidRequest } from './params';

/** "$600.00", the way the real messages write amounts. */
export function formatAmount(minor: number, currency: string): string {
  return formatMoney(minor, currency.toUpperCase());
}

// Stripe documentation, docs.stripe.com/currencies, "Minimum and maximum charge amounts"
// (in minor units: USD, EUR, CAD and AUD 0.50; GBP 0.30). Other currencies are not checked.
const MINIMUM_CHARGE: Record<string, number> = { usd: 50, eur: 50, cad: 50, aud: 50, gbp: 30 };
// Stripe documentation, docs.stripe.com/currencies: amounts have at most eight digits.
const MAXIMUM_CHARGE = 99_999_999;

/** Refuses a charge amount outside what the real API takes, with its message. */
export function checkChargeAmount(amount: number, currency: string, o: { param: string; session: boolean }) {
  const minimum = MINIMUM_CHARGE[currency];
  if (minimum !== undefined && amount < minimum) {
    const least = `${formatAmount(minimum, currency)} ${currency}`;
    throw invalidRequest(
      o.session
        ? `The Checkout Session's total amount due must add up to at least ${least}`
        : `Amount must be at least ${least}`,
      { code: 'amount_too_small', param: o.param },
    );
  }
  if (amount > MAXIMUM_CHARGE) {
    throw invalidRequest(`Amount must be no more than ${formatAmount(MAXIMUM_CHARGE, currency)}`, {
      code: 'amount_too_large',
      param: o.param,
    });
  }
}
