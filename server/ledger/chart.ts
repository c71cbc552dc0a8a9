import { QueryTypes } from 'sequelize';
import { sequelize, type Transaction } from '../db';
import type { AccountType } from '../models/Account';

/** The roles the posting rules post to. A company may renumber or rename the accounts behind them. */
export const SYSTEM_KEYS = [
  'cash_on_hand', 'bank', 'card_clearing', 'accounts_receivable',
  'customer_deposits', 'customer_credit', 'security_deposits_held', 'sales_tax_payable',
  'rental_revenue', 'delivery_labor_revenue', 'damage_waiver_revenue', 'damage_recovery', 'refunds',
  'card_processing_fees',
] as const;
export type SystemKey = (typeof SYSTEM_KEYS)[number];

/** The revenue accounts an invoice splits into; customer-deposit lines carry one of these. */
export const REVENUE_KEYS = ['rental_revenue', 'delivery_labor_revenue', 'damage_waiver_revenue'] as const;
export type RevenueKey = (typeof REVENUE_KEYS)[number];

export interface ChartAccount { code: string; name: string; type: AccountType; systemKey: SystemKey }

/**
 * The default chart of a small US rental company: assets in 1xxx, liabilities in 2xxx, revenue in
 * 4xxx, expenses in 6xxx, the usual small-business numbering. Codes and names are our own defaults; the company
 * changes them in settings.
 */
export const DEFAULT_CHART: readonly ChartAccount[] = [
  // Cash and checks taken in hand sit here until they are taken to the bank ("undeposited funds").
  { code: '1000', name: 'Cash on hand', type: 'asset', systemKey: 'cash_on_hand' },
  { code: '1010', name: 'Bank — operating account', type: 'asset', systemKey: 'bank' },
  // Card payments between the charge and the processor's payout.
  { code: '1050', name: 'Card clearing', type: 'asset', systemKey: 'card_clearing' },
  { code: '1200', name: 'Accounts receivable', type: 'asset', systemKey: 'accounts_receivable' },
  // Billed or paid before the event: a contract liability until the event (ASC 606-10-45-2).
  { code: '2100', name: 'Customer deposits', type: 'liability', systemKey: 'customer_deposits' },
  // Money the customer has with us beyond what they owe (an overpayment, a credit note on a paid
  // invoice): owed back or used on their next invoice, so a liability.
  { code: '2120', name: 'Customer credit', type: 'liability', systemKey: 'customer_credit' },
  // Refundable security deposits: the customer's money until settled, never revenue while held.
  { code: '2150', name: 'Security deposits held', type: 'liability', systemKey: 'security_deposits_held' },
  { code: '2200', name: 'Sales tax payable', type: 'liability', systemKey: 'sales_tax_payable' },
  { code: '4000', name: 'Rental revenue', type: 'revenue', systemKey: 'rental_revenue' },
  { code: '4100', name: 'Delivery and labor revenue', type: 'revenue', systemKey: 'delivery_labor_revenue' },
  { code: '4200', name: 'Damage waiver revenue', type: 'revenue', systemKey: 'damage_waiver_revenue' },
  { code: '4300', name: 'Damage recovery', type: 'revenue', systemKey: 'damage_recovery' },
  // Credit notes after the event land here, so gross revenue stays visible beside what was given back.
  { code: '4900', name: 'Refunds and allowances', type: 'contra_revenue', systemKey: 'refunds' },
  // What the card processor keeps of each card payment: a cost of taking cards, never less revenue.
  // Companies made before it get it from migration 20261204-0002 (or here, on their next posting).
  { code: '6100', name: 'Card processing fees', type: 'expense', systemKey: 'card_processing_fees' },
];

/**
 * Creates the default chart for a company the first time; later calls (and calls racing it in
 * other transactions) do nothing: the unique (organization, code) and (organization, system key)
 * indexes make the losers' inserts no-ops. An account the company has renumbered is recognised
 * by its system key and not created again.
 */
export async function ensureChart(organizationId: string, t: Transaction): Promise<void> {
  const values = DEFAULT_CHART.map((_, i) => `(:org, :code${i}, :name${i}, CAST(:type${i} AS enum_accounts_type), :key${i})`).join(', ');
  const replacements: Record<string, string> = { org: organizationId };
  DEFAULT_CHART.forEach((a, i) => {
    replacements[`code${i}`] = a.code;
    replacements[`name${i}`] = a.name;
    replacements[`type${i}`] = a.type;
    replacements[`key${i}`] = a.systemKey;
  });
  await sequelize.query(
    `INSERT INTO accounts (organization_id, code, name, type, system_key) VALUES ${values} ON CONFLICT DO NOTHING`,
    { replacements, type: QueryTypes.INSERT, transaction: t },
  );
}
