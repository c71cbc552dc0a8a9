/**
 * The owner's reports (issue 8): the queries each one takes and the figures it answers with.
 * Every figure carries what is behind it: invoice ids (the invoice pages), booking ids (the
 * booking's money panel), a customer id (the statement) or a `trace` naming the journal entries
 * it is summed from, which GET /api/reports/entries lists.
 */
import { z } from 'zod';
import type { AgingBucket } from '../aging';

const DateOnly = z.iso.date({ error: 'Give the date as YYYY-MM-DD.' });
const Month = z.string({ error: 'Give the month as YYYY-MM.' }).regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'Give the month as YYYY-MM.');

/** Reports look back at most this far in one request: ten years of a small company's books. */
export const MAX_REPORT_DAYS = 3660;
const spanDays = (from: string, to: string) => (Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000;

/** GET /api/reports/aging and /deposits: as of the end of a day (today in the company's zone when left out). */
export const AtDateQuery = z.object({ at: DateOnly.optional() });
export type AtDateQuery = z.infer<typeof AtDateQuery>;

/** A period of whole days, both ends included (this year so far when left out). */
export const PeriodQuery = z
  .object({ from: DateOnly.optional(), to: DateOnly.optional() })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'The end date comes on or after the start date.' })
  .refine((q) => !q.from || !q.to || spanDays(q.from, q.to) <= MAX_REPORT_DAYS, { path: ['from'], message: 'Choose a period of at most ten years.' });
export type PeriodQuery = z.infer<typeof PeriodQuery>;

/** GET /api/reports/sales-tax: whole months, both included (this year's months so far when left out). */
export const MonthRangeQuery = z
  .object({ from: Month.optional(), to: Month.optional() })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'The last month comes on or after the first.' })
  .refine((q) => !q.from || !q.to || monthsBetween(q.from, q.to) < 120, { path: ['from'], message: 'Choose at most ten years of months.' });
export type MonthRangeQuery = z.infer<typeof MonthRangeQuery>;

/** GET /api/reports/revenue: a calendar year against the one before (this year when left out). */
export const RevenueQuery = z.object({
  year: z.coerce.number({ error: 'Give the year as four digits.' }).int('Give the year as four digits.').min(2000, 'Choose a year from 2000 on.').max(2100, 'Choose a year before 2100.').optional(),
});
export type RevenueQuery = z.infer<typeof RevenueQuery>;

/** Months from `from` to `to` (YYYY-MM), 0 when the same month. */
export function monthsBetween(from: string, to: string): number {
  const [fy, fm] = from.split('-').map(Number);
  const [ty, tm] = to.split('-').map(Number);
  return (ty - fy) * 12 + (tm - fm);
}

const isUuid = (s: string) => z.uuid().safeParse(s).success;
const uuidList = z
  .string({ error: 'Name at least one account.' })
  .transform((s) => s.split(',').map((x) => x.trim()).filter(Boolean))
  .pipe(
    z
      .array(z.string())
      .min(1, 'Name at least one account.')
      .max(20, 'At most 20 accounts.')
      .refine((ids) => ids.every(isUuid), 'Not a valid account id.'),
  );

/**
 * GET /api/reports/entries: the journal entries behind a figure. The `trace` of a figure is this
 * query: its accounts, its period (both ends included, in the company's zone) and what it is
 * narrowed to (a booking, a customer, a tax rate).
 */
export const EntriesQuery = z
  .object({
    accountIds: uuidList,
    from: DateOnly.optional(),
    to: DateOnly.optional(),
    bookingId: z.uuid({ error: 'Not a valid booking id.' }).optional(),
    customerId: z.uuid({ error: 'Not a valid customer id.' }).optional(),
    /** Entries of bookings taxed at this rate, in basis points (725 = 7.25%). */
    taxRateBp: z.coerce.number({ error: 'Give the rate in basis points.' }).min(0, 'A rate is not negative.').max(3000, 'A rate above 30% is not plausible.').optional(),
    page: z.coerce.number({ error: 'Page must be a number.' }).int().min(1, 'Pages start at 1.').default(1),
    pageSize: z.coerce.number({ error: 'Page size must be a number.' }).int().min(1).max(200, 'At most 200 a page.').default(100),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'The end date comes on or after the start date.' });
export type EntriesQuery = z.infer<typeof EntriesQuery>;

/** What a ledger figure is summed from: the query of GET /api/reports/entries that lists it. */
export interface EntriesTrace {
  accountIds: string[];
  from?: string;
  to?: string;
  bookingId?: string;
  customerId?: string;
  taxRateBp?: number;
}

export interface ReportAccount {
  id: string;
  code: string;
  name: string;
}

/** A ledger balance beside the report's own total, so the screen can say whether they agree. */
export interface LedgerCheck {
  account: ReportAccount;
  ledgerCents: number;
  reportCents: number;
  /** reportCents - ledgerCents: zero when they agree. */
  differenceCents: number;
  trace: EntriesTrace;
}

// ---------------------------------------------------------------- aging

export interface AgingInvoice {
  id: string;
  number: string;
  kind: 'deposit' | 'balance' | 'additional';
  bookingId: string;
  bookingReference: string;
  issueDate: string;
  dueDate: string;
  daysPastDue: number;
  bucket: AgingBucket;
  totalCents: number;
  /** Paid and credited on the report's date (later payments do not count). */
  paidCents: number;
  creditedCents: number;
  balanceCents: number;
}

export interface AgingCustomerRow {
  customer: { id: string; name: string };
  buckets: Record<AgingBucket, number>;
  totalCents: number;
  /** The open invoices behind the row, oldest due date first. */
  invoices: AgingInvoice[];
}

/** GET /api/reports/aging */
export interface AgingReport {
  at: string;
  timeZone: string;
  currency: string;
  customers: AgingCustomerRow[];
  totals: Record<AgingBucket, number>;
  totalCents: number;
  /** The open invoices' balances against accounts receivable in the ledger on the same date. */
  reconciliation: LedgerCheck;
}

// ---------------------------------------------------------------- deposits held

export interface HeldByBooking {
  booking: { id: string; reference: string; status: string; eventDate: string } | null;
  customer: { id: string; name: string } | null;
  cents: number;
  trace: EntriesTrace;
}

export interface HeldSection {
  account: ReportAccount;
  rows: HeldByBooking[];
  totalCents: number;
  check: LedgerCheck;
}

/** GET /api/reports/deposits */
export interface DepositsReport {
  at: string;
  timeZone: string;
  currency: string;
  /** Billed or paid before the event: a contract liability until the event day. */
  customerDeposits: HeldSection;
  /** Refundable security deposits still held. */
  securityDeposits: HeldSection;
  /** Overpayments and credit notes on paid invoices: the customer's money, by customer. */
  customerCredit: HeldSection;
  /** All three together: what the company owes back or has not yet earned. */
  totalCents: number;
}

// ---------------------------------------------------------------- sales tax

export interface SalesTaxRow {
  month: string;
  taxRateBp: number;
  /** Tax on invoices issued in the month (credits to sales tax payable). */
  billedCents: number;
  /** Tax given back by credit notes and voids in the month (debits). */
  returnedCents: number;
  netCents: number;
  /** How many invoices and credit notes are behind the row (the entries drawer links each). */
  invoiceCount: number;
  trace: EntriesTrace;
}

/** GET /api/reports/sales-tax */
export interface SalesTaxReport {
  from: string;
  to: string;
  timeZone: string;
  currency: string;
  rows: SalesTaxRow[];
  /** Each month's net tax across rates, every month of the range (zero included), for the chart. */
  months: { month: string; netCents: number; trace: EntriesTrace }[];
  billedCents: number;
  returnedCents: number;
  netCents: number;
  /** The net credit movement of sales tax payable over the same days. */
  reconciliation: LedgerCheck;
}

// ---------------------------------------------------------------- revenue

export interface RevenueAccountRow {
  account: ReportAccount & { type: 'revenue' | 'contra_revenue' };
  /** Net revenue by month, January first: credits less debits (negative for refunds and allowances). */
  thisYear: number[];
  lastYear: number[];
  thisYearTotalCents: number;
  lastYearTotalCents: number;
  thisYearTraces: EntriesTrace[];
  lastYearTraces: EntriesTrace[];
}

/** GET /api/reports/revenue */
export interface RevenueReport {
  year: number;
  timeZone: string;
  currency: string;
  accounts: RevenueAccountRow[];
  totals: { thisYear: number[]; lastYear: number[]; thisYearCents: number; lastYearCents: number; thisYearTraces: EntriesTrace[]; lastYearTraces: EntriesTrace[] };
  /** Net revenue of each year against the change of the revenue accounts' balances in the ledger. */
  reconciliation: { thisYear: LedgerCheck; lastYear: LedgerCheck };
}

// ---------------------------------------------------------------- stock utilization and payback

export interface StockBookingRow {
  bookingId: string;
  reference: string;
  status: string;
  eventDate: string;
  deliveryDate: string;
  pickupDate: string;
  quantity: number;
  /** Unit-days inside the period (quantity x days); 0 for a booking that did not hold stock. */
  daysOutInPeriod: number;
  /** The item's share of the rental billed on the booking's invoices, net of credit notes. */
  revenueCents: number;
  /** The deposit and balance invoices and their credit notes the revenue comes from. */
  invoices: { id: string; number: string | null }[];
}

export interface StockItemRow {
  item: { id: string; name: string; kind: string; quantityOwned: number; purchaseCostCents: number; createdDate: string };
  /** Units x days owned in the period (from the day the item was added). */
  daysOwned: number;
  /** Units x days out on reserved, out, returned and closed bookings, delivery to pickup day. */
  daysOut: number;
  /** daysOut / daysOwned in basis points (10000 = always out); null when nothing was owned. */
  utilizationBp: number | null;
  revenueInPeriodCents: number;
  revenueToDateCents: number;
  /** Purchase cost x quantity owned. */
  costCents: number;
  /** The event day on which the revenue to date first reached the cost; null when not yet or no cost. */
  paidForItselfOn: string | null;
  payback: 'paid_back' | 'not_yet' | 'no_cost';
  /** The bookings that took it out or earned from it in the period. */
  bookingCount: number;
  /** Those bookings: only in GET /api/reports/stock/items/:id (the list leaves them out). */
  bookings: StockBookingRow[];
}

/** GET /api/reports/stock, and GET /api/reports/stock/items/:id (one item, with its bookings) */
export interface StockReport {
  from: string;
  to: string;
  timeZone: string;
  currency: string;
  items: StockItemRow[];
}

// ---------------------------------------------------------------- shortfalls

export interface ShortfallRequest {
  id: string;
  recordedAt: string;
  booking: { id: string; reference: string; customerName: string } | null;
  windowStart: string;
  windowEnd: string;
  requested: number;
  available: number;
  shortfall: number;
}

export interface ShortfallItemRow {
  item: { id: string; name: string; kind: string; quantityOwned: number };
  /** How many times the stock could not meet a request. */
  count: number;
  bookingCount: number;
  /** Units short, added over every request. */
  totalShort: number;
  /** The most units short in one request: buying that many would have met each request alone. */
  largestShort: number;
  firstDate: string;
  lastDate: string;
  requests: ShortfallRequest[];
}

/** GET /api/reports/shortfalls */
export interface ShortfallsReport {
  from: string;
  to: string;
  timeZone: string;
  items: ShortfallItemRow[];
}

// ---------------------------------------------------------------- entries behind a figure

export interface TracedEntry {
  id: string;
  occurredAt: string;
  kind: string;
  memo: string;
  booking: { id: string; reference: string } | null;
  customer: { id: string; name: string } | null;
  /** The invoice or credit note the entry records, when it records one. */
  invoice: { id: string; number: string | null } | null;
  lines: { accountId: string; accountCode: string; accountName: string; debitCents: number; creditCents: number; traced: boolean }[];
  /** The entry's effect on the figure. */
  effectCents: number;
}

/** GET /api/reports/entries */
export interface TracedEntries {
  accounts: (ReportAccount & { type: string })[];
  entries: TracedEntry[];
  /** Entries over every page. */
  total: number;
  /** The figure: every entry's effect added, over every page. */
  totalCents: number;
  /** Credits less debits for liabilities and revenue (contra revenue reads negative), debits less credits for assets. */
  side: 'credit' | 'debit';
  currency: string;
  timeZone: string;
}
