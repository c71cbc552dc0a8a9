/**
 * The test cards the fake knows and how each behaves, plus the checks a payment form makes
 * before a card ever reaches an issuer (number format and Luhn digit, expiry, security code).
 *
 * Every number and its behaviour is taken from the card processor's published testing
 * documentation (docs.stripe.com/testing); the section is named beside each entry. A number that
 * passes the checks but is not in the table is refused the way the real test mode refuses a live
 * card, so nobody mistakes the fake for somewhere real cards may be typed.
 */

export type CardBrand = 'visa' | 'mastercard' | 'amex' | 'discover' | 'unknown';

/** What an issuer says about a charge on this card. */
export interface CardDecline {
  code: string;
  decline_code?: string;
  message: string;
}

export interface TestCard {
  number: string;
  brand: CardBrand;
  funding: 'credit' | 'debit';
  /** Test payment method ids (`pm_card_...`) that stand for this card in API-only payments. */
  paymentMethods?: string[];
  /** The issuer asks the payer to authenticate (the page simulates the step). */
  authentication?: boolean;
  /** The issuer declines, after authentication when that is asked too. */
  decline?: CardDecline;
  /** How a refund of a charge on this card ends. Default: succeeds at once. */
  refund?: 'fails_later' | 'pending_then_succeeds';
  description: string;
}

const GENERIC_DECLINE = 'Your card was declined.';

export const TEST_CARDS: readonly TestCard[] = [
  // Stripe testing documentation, docs.stripe.com/testing, "Cards by brand"
  { number: '4242424242424242', brand: 'visa', funding: 'credit', paymentMethods: ['pm_card_visa'], description: 'Visa, succeeds' },
  // Stripe testing documentation, docs.stripe.com/testing, "Cards by brand"
  { number: '4000056655665556', brand: 'visa', funding: 'debit', paymentMethods: ['pm_card_visa_debit'], description: 'Visa debit, succeeds' },
  // Stripe testing documentation, docs.stripe.com/testing, "Cards by brand"
  { number: '5555555555554444', brand: 'mastercard', funding: 'credit', paymentMethods: ['pm_card_mastercard'], description: 'Mastercard, succeeds' },
  // Stripe testing documentation, docs.stripe.com/testing, "Cards by brand" (four-digit CVC)
  { number: '378282246310005', brand: 'amex', funding: 'credit', paymentMethods: ['pm_card_amex'], description: 'American Express, succeeds' },
  // Stripe testing documentation, docs.stripe.com/testing, "Cards by brand"
  { number: '6011111111111117', brand: 'discover', funding: 'credit', paymentMethods: ['pm_card_discover'], description: 'Discover, succeeds' },

  // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": generic decline
  {
    number: '4000000000000002', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_visa_chargeDeclined', 'pm_card_chargeDeclined'],
    decline: { code: 'card_declined', decline_code: 'generic_decline', message: GENERIC_DECLINE },
    description: 'Declined (generic_decline)',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": insufficient funds
  {
    number: '4000000000009995', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_visa_chargeDeclinedInsufficientFunds', 'pm_card_chargeDeclinedInsufficientFunds'],
    decline: { code: 'card_declined', decline_code: 'insufficient_funds', message: 'Your card has insufficient funds.' },
    description: 'Declined (insufficient_funds)',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": lost card
  {
    number: '4000000000009987', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_visa_chargeDeclinedLostCard', 'pm_card_chargeDeclinedLostCard'],
    decline: { code: 'card_declined', decline_code: 'lost_card', message: GENERIC_DECLINE },
    description: 'Declined (lost_card)',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": stolen card
  {
    number: '4000000000009979', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_visa_chargeDeclinedStolenCard', 'pm_card_chargeDeclinedStolenCard'],
    decline: { code: 'card_declined', decline_code: 'stolen_card', message: GENERIC_DECLINE },
    description: 'Declined (stolen_card)',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": expired card
  {
    number: '4000000000000069', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_chargeDeclinedExpiredCard'],
    decline: { code: 'expired_card', decline_code: 'expired_card', message: 'Your card has expired.' },
    description: 'Declined (expired_card)',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": incorrect CVC
  {
    number: '4000000000000127', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_chargeDeclinedIncorrectCvc'],
    decline: { code: 'incorrect_cvc', decline_code: 'incorrect_cvc', message: "Your card's security code is incorrect." },
    description: 'Declined (incorrect_cvc)',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": processing error
  {
    number: '4000000000000119', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_chargeDeclinedProcessingError'],
    decline: {
      code: 'processing_error', decline_code: 'processing_error',
      message: 'An error occurred while processing your card. Try again in a little bit.',
    },
    description: 'Declined (processing_error)',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": exceeding velocity limit
  {
    number: '4000000000006975', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_visa_chargeDeclinedVelocityLimitExceeded'],
    decline: {
      code: 'card_declined', decline_code: 'card_velocity_exceeded',
      message: 'Your card was declined for making repeated attempts too frequently or exceeding its amount limit.',
    },
    description: 'Declined (card_velocity_exceeded)',
  },

  // Stripe testing documentation, docs.stripe.com/testing, "3D Secure authentication":
  // authentication must be completed for the payment to succeed
  {
    number: '4000000000003220', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_threeDSecure2Required'], authentication: true,
    description: 'Asks for authentication, then succeeds',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "3D Secure authentication":
  // authentication required on all transactions
  {
    number: '4000002760003184', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_authenticationRequired'], authentication: true,
    description: 'Always asks for authentication',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "3D Secure authentication":
  // requires authentication for one-time payments
  {
    number: '4000002500003155', brand: 'visa', funding: 'credit', authentication: true,
    description: 'Asks for authentication on one-time payments',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "3D Secure authentication":
  // requires authentication, then the payment is declined with insufficient_funds
  {
    number: '4000008260003178', brand: 'visa', funding: 'credit', authentication: true,
    decline: { code: 'card_declined', decline_code: 'insufficient_funds', message: 'Your card has insufficient funds.' },
    description: 'Asks for authentication, then declined (insufficient_funds)',
  },

  // Stripe testing documentation, docs.stripe.com/testing, "Refunds": asynchronous failure
  // (the refund starts succeeded, later fails with failure_reason expired_or_canceled_card)
  {
    number: '4000000000005126', brand: 'visa', funding: 'credit',
    paymentMethods: ['pm_card_refundFail'], refund: 'fails_later',
    description: 'Succeeds; a refund of it fails later',
  },
  // Stripe testing documentation, docs.stripe.com/testing, "Refunds": asynchronous success
  // (the refund starts pending, later succeeds)
  {
    number: '4000000000007726', brand: 'visa', funding: 'credit', refund: 'pending_then_succeeds',
    description: 'Succeeds; a refund of it is pending first',
  },
];

const BY_NUMBER = new Map(TEST_CARDS.map((c) => [c.number, c]));
const BY_PAYMENT_METHOD = new Map(TEST_CARDS.flatMap((c) => (c.paymentMethods ?? []).map((pm) => [pm, c] as const)));

/** How the real test mode answers a card number that is not one of its test cards. */
export const LIVE_CARD_IN_TEST_MODE: CardDecline = {
  code: 'card_declined',
  decline_code: 'test_mode_live_card',
  message:
    'Your card was declined. Your request was in test mode, but used a non test card. ' +
    'For a list of valid test cards, see the card testing documentation.',
};

export function findTestCard(number: string): TestCard | undefined {
  return BY_NUMBER.get(number);
}

export function findTestPaymentMethod(id: string): TestCard | undefined {
  return BY_PAYMENT_METHOD.get(id);
}

/** Luhn check digit test, ISO/IEC 7812-1 Annex B. `digits` holds digits only. */
export function passesLuhn(digits: string): boolean {
  if (!/^\d+$/.test(digits)) return false;
  let total = 0;
  for (let i = 0; i < digits.length; i++) {
    let d = digits.charCodeAt(digits.length - 1 - i) - 48;
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    total += d;
  }
  return total % 10 === 0;
}

/** Brand from the number's leading digits (IIN ranges), for numbers outside the table. */
export function brandOf(digits: string): CardBrand {
  if (/^4/.test(digits)) return 'visa';
  if (/^(5[1-5]|2[2-7])/.test(digits)) return 'mastercard';
  if (/^3[47]/.test(digits)) return 'amex';
  if (/^6(011|5)/.test(digits)) return 'discover';
  return 'unknown';
}

export type CardField = 'cardNumber' | 'expiry' | 'cvc';

export interface CardFieldError {
  field: CardField;
  code: string;
  message: string;
}

export interface CheckedCard {
  number: string;
  last4: string;
  brand: CardBrand;
  expMonth: number;
  expYear: number;
  card: TestCard | undefined;
}

export interface CardInput {
  cardNumber?: unknown;
  expiry?: unknown;
  cvc?: unknown;
}

/**
 * The checks a card form makes before anything is sent to an issuer. Spaces (and dashes) in the
 * number are ignored. A card is good through the last day of its expiry month. Returns every
 * field error at once so a form can mark each field.
 */
export function checkCardInput(input: CardInput, now = new Date()): { card: CheckedCard } | { errors: CardFieldError[] } {
  const errors: CardFieldError[] = [];
  const number = String(input.cardNumber ?? '').replace(/[\s-]/g, '');
  const brand = findTestCard(number)?.brand ?? brandOf(number);

  if (number === '') {
    errors.push({ field: 'cardNumber', code: 'incomplete_number', message: 'Enter the card number.' });
  } else if (!/^\d{12,19}$/.test(number)) {
    errors.push({ field: 'cardNumber', code: 'invalid_number', message: 'Your card number is invalid.' });
  } else if (!passesLuhn(number)) {
    errors.push({ field: 'cardNumber', code: 'incorrect_number', message: 'Your card number is incorrect.' });
  }

  let expMonth = 0;
  let expYear = 0;
  const expiry = String(input.expiry ?? '').trim();
  const m = /^(\d{1,2})\s*\/\s*(\d{2}|\d{4})$/.exec(expiry);
  if (expiry === '') {
    errors.push({ field: 'expiry', code: 'incomplete_expiry', message: 'Enter the expiry date as MM/YY.' });
  } else if (!m) {
    errors.push({ field: 'expiry', code: 'invalid_expiry_year', message: 'Enter the expiry date as MM/YY, for example 04/30.' });
  } else {
    expMonth = Number(m[1]);
    expYear = m[2].length === 2 ? 2000 + Number(m[2]) : Number(m[2]);
    if (expMonth < 1 || expMonth > 12) {
      errors.push({ field: 'expiry', code: 'invalid_expiry_month', message: "Your card's expiration month is invalid." });
    } else if (expYear < now.getUTCFullYear() || (expYear === now.getUTCFullYear() && expMonth < now.getUTCMonth() + 1)) {
      errors.push({ field: 'expiry', code: 'expired_card', message: "Your card's expiration date is in the past." });
    }
  }

  const cvc = String(input.cvc ?? '').trim();
  const cvcLength = brand === 'amex' ? 4 : 3;
  if (cvc === '') {
    errors.push({ field: 'cvc', code: 'incomplete_cvc', message: 'Enter the security code.' });
  } else if (!new RegExp(`^\\d{${cvcLength}}$`).test(cvc)) {
    errors.push({
      field: 'cvc',
      code: 'invalid_cvc',
      message: `Your card's security code is invalid. It has ${cvcLength} digits.`,
    });
  }

  if (errors.length > 0) return { errors };
  return { card: { number, last4: number.slice(-4), brand, expMonth, expYear, card: findTestCard(number) } };
}
