import type { AccountRow } from '@shared/schemas/invoices';

/** "invoice_issued" -> "Invoice issued", for an entry without a memo. */
export const kindText = (kind: string) => {
  const words = kind.replaceAll('_', ' ').trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
};

export const ACCOUNT_TYPE_LABELS: Record<AccountRow['type'], string> = {
  asset: 'Asset',
  liability: 'Liability',
  equity: 'Equity',
  revenue: 'Revenue',
  expense: 'Expense',
  contra_revenue: 'Less revenue',
};

/** What the posting rules use each system account for, in plain words. */
export const ACCOUNT_PURPOSE_LABELS: Record<string, string> = {
  accounts_receivable: 'What customers owe',
  customer_deposits: 'Deposits received before events',
  security_deposits_held: 'Security deposits held',
  sales_tax_payable: 'Sales tax to pay',
  rental_revenue: 'Rentals earned',
  delivery_labor_revenue: 'Delivery, set-up and labor earned',
  damage_waiver_revenue: 'Damage waivers earned',
  damage_recovery: 'Damage charged to customers',
  refunds: 'Credit notes after the event (revenue given back)',
  cash_on_hand: 'Cash and checks not yet banked',
  bank: 'Bank transfers',
  card_clearing: 'Card payments on their way to the bank',
  card_processing_fees: 'What the card processor keeps of each card payment',
};

export const accountPurpose = (systemKey: string | null) => (systemKey ? (ACCOUNT_PURPOSE_LABELS[systemKey] ?? kindText(systemKey)) : '');
