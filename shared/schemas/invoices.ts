import { z } from 'zod';
import { addDays, dateInZone } from '../dates';
import { PAYMENT_METHODS } from './documents';

export const INVOICE_KINDS = ['deposit', 'balance', 'additional', 'credit_note'] as const;
export type InvoiceKind = (typeof INVOICE_KINDS)[number];
export const INVOICE_KIND_LABELS: Record<InvoiceKind, string> = {
  deposit: 'Deposit invoice',
  balance: 'Balance invoice',
  additional: 'Additional charges',
  credit_note: 'Credit note',
};
export const INVOICE_STATUSES = ['draft', 'open', 'partly_paid', 'paid', 'void'] as const;
export type InvoiceStatus = (typeof INVOICE_STATUSES)[number];
export const INVOICE_STATUS_LABELS: Record<InvoiceStatus, string> = {
  draft: 'Draft',
  open: 'Open',
  partly_paid: 'Partly paid',
  paid: 'Paid',
  void: 'Void',
};

/** Where an invoice line's money belongs in the ledger. */
export const INVOICE_CATEGORIES = ['rental', 'delivery_labor', 'damage_waiver', 'damage', 'tax'] as const;
export type InvoiceCategory = (typeof INVOICE_CATEGORIES)[number];

export interface InvoiceLineRow {
  description: string;
  category: InvoiceCategory;
  amountCents: number;
}

export interface InvoiceRow {
  id: string;
  bookingId: string;
  bookingReference: string;
  customer: { id: string; name: string; email: string };
  kind: InvoiceKind;
  /** Null while a draft: numbers are given at issue, in order, never reused. */
  number: string | null;
  status: InvoiceStatus;
  issueDate: string | null;
  dueDate: string | null;
  overdue: boolean;
  lines: InvoiceLineRow[];
  subtotalCents: number;
  taxCents: number;
  totalCents: number;
  /** Paid in money, security deposit or account credit, less refunds. */
  paidCents: number;
  /** Taken off this invoice's balance by credit notes. */
  creditedCents: number;
  /** Every credit note's total on this invoice, including what became account credit. */
  creditNotesCents: number;
  /** total - paid - credited; zero once void. */
  balanceCents: number;
  currency: string;
  documentId: string | null;
  voidReason: string | null;
  /** On a credit note: the invoice it lowers, and why. */
  creditsInvoice: { id: string; number: string | null } | null;
  reason: string | null;
  /** The customer's pay link (card payment, no sign-in) while something is due and card payments are set up. */
  payUrl: string | null;
  /** When `payUrl` stops working (a new one is made each day; each e-mail of the invoice carries its own). */
  payLinkEndsAt: string | null;
  createdAt: string;
  /** revokePayLink: withdraw every pay link of the invoice made so far. */
  can: { issue: boolean; void: boolean; recordPayment: boolean; creditNote: boolean; applyCredit: boolean; revokePayLink: boolean };
}

/** What an additional-charges invoice may bill after the event. */
export const ADDITIONAL_CHARGES = ['damage', 'missing', 'late_return', 'cleaning'] as const;
export type AdditionalCharge = (typeof ADDITIONAL_CHARGES)[number];
export const ADDITIONAL_CHARGE_LABELS: Record<AdditionalCharge, string> = {
  damage: 'Damage (repair)',
  missing: 'Missing item (replacement)',
  late_return: 'Late return',
  cleaning: 'Cleaning',
};
/**
 * Where each charge's money belongs: damage and missing stock are damage recovery; a late return
 * is more rental; cleaning is a service, with delivery and labor.
 */
export const ADDITIONAL_CHARGE_CATEGORY: Record<AdditionalCharge, InvoiceCategory> = {
  damage: 'damage',
  missing: 'damage',
  late_return: 'rental',
  cleaning: 'delivery_labor',
};
/**
 * Whether a charge is taxed unless the office says otherwise. Extra rental days and services are
 * taxed like the rental; reimbursement for damaged or lost property often is not, but states
 * differ, so each line can be switched (common practice, no published source; the company's tax
 * adviser and state rules decide).
 */
export const ADDITIONAL_CHARGE_TAXABLE: Record<AdditionalCharge, boolean> = { damage: false, missing: false, late_return: true, cleaning: true };

export const AdditionalChargeLine = z.object({
  charge: z.enum(ADDITIONAL_CHARGES, { error: 'Choose damage, missing, late return or cleaning.' }),
  description: z.string({ error: 'Describe the charge.' }).trim().min(2, 'Describe the charge.').max(200, 'Use at most 200 characters.'),
  amountCents: z.number({ error: 'Enter the amount.' }).int('Amounts are whole cents.').min(1, 'The amount must be above zero.').max(100_000_000_00),
  taxable: z.boolean().optional(),
});
export type AdditionalChargeLine = z.input<typeof AdditionalChargeLine>;

/** POST /api/bookings/:id/invoices: a deposit or balance invoice from the quote, or additional charges line by line. */
export const CreateInvoiceRequest = z
  .object({
    kind: z.enum(['deposit', 'balance', 'additional'], { error: 'Choose a deposit, balance or additional-charges invoice.' }),
    lines: z.array(AdditionalChargeLine).max(50, 'At most 50 lines.').optional(),
  })
  .refine((v) => v.kind !== 'additional' || (v.lines?.length ?? 0) > 0, { path: ['lines'], message: 'Add at least one charge.' });
export type CreateInvoiceRequest = z.input<typeof CreateInvoiceRequest>;

/** POST /api/invoices/:id/credit-notes: lowers an issued invoice; what it cannot take off the invoice becomes the customer's credit. */
export const CreditNoteRequest = z.object({
  amountCents: z.number({ error: 'Enter the amount to credit.' }).int('Amounts are whole cents.').min(1, 'The amount must be above zero.').max(100_000_000_00),
  reason: z.string({ error: 'Say why.' }).trim().min(3, 'Say why the customer is credited.').max(500),
});
export type CreditNoteRequest = z.input<typeof CreditNoteRequest>;

/** POST /api/invoices/:id/apply-credit: pays an invoice from the customer's credit. */
export const ApplyCreditRequest = z.object({
  amountCents: z.number({ error: 'Enter the amount.' }).int('Amounts are whole cents.').min(1, 'The amount must be above zero.').max(100_000_000_00),
});
export type ApplyCreditRequest = z.input<typeof ApplyCreditRequest>;

/** POST /api/customers/:id/credit/refunds (owner): pays the customer's credit back. */
export const CreditRefundRequest = z.object({
  amountCents: z.number({ error: 'Enter the amount.' }).int('Amounts are whole cents.').min(1, 'The amount must be above zero.').max(100_000_000_00),
  method: z.enum(['cash', 'check', 'transfer', 'card'], { error: 'Choose how the money goes back.' }),
  reason: z.string({ error: 'Say why.' }).trim().min(3, 'Say why the money goes back.').max(500),
});
export type CreditRefundRequest = z.input<typeof CreditRefundRequest>;
export interface CreditRefundResponse {
  entryId: string;
  /** The customer's credit left after this. */
  creditCents: number;
}

/** GET /api/customers/:id/credit */
export interface CustomerCredit {
  creditCents: number;
  currency: string;
  /** The entries that moved the credit, newest first. */
  moves: { entryId: string; occurredAt: string; kind: string; memo: string; bookingReference: string | null; inCents: number; outCents: number }[];
}

export const VoidInvoiceRequest = z.object({
  reason: z.string({ error: 'Say why the invoice is void.' }).trim().min(3, 'Say why the invoice is void.').max(500),
});

export const InvoiceListQuery = z.object({
  page: z.coerce.number().int().min(1, 'Pages start at 1.').default(1),
  pageSize: z.coerce.number().int().min(1).max(200, 'At most 200 a page.').default(50),
  status: z
    .string()
    .optional()
    .transform((s) => (s ? s.split(',').filter(Boolean) : undefined))
    .pipe(z.array(z.enum([...INVOICE_STATUSES, 'overdue'] as const, { error: 'Unknown status.' })).optional()),
  bookingId: z.uuid().optional(),
  q: z.string().trim().max(100).optional(),
});
export type InvoiceListQuery = z.infer<typeof InvoiceListQuery>;

export const OFFLINE_METHODS = PAYMENT_METHODS.filter((m) => m !== 'card') as ['cash', 'check', 'transfer'];

/** POST /api/payments: cash, check or transfer, on one invoice or split across several. */
export const RecordPaymentRequest = z
  .object({
    method: z.enum(['cash', 'check', 'transfer'], { error: 'Choose cash, check or transfer.' }),
    reference: z.string().trim().max(80, 'Use at most 80 characters.').default(''),
    receivedAt: z.iso.datetime({ offset: true, error: 'Enter when it was received.' }).optional(),
    /** One invoice… */
    invoiceId: z.uuid({ error: 'Choose an invoice.' }).optional(),
    amountCents: z.number({ error: 'Enter the amount.' }).int('Amounts are whole cents.').min(1, 'The amount must be above zero.').max(100_000_000_00).optional(),
    /** With one invoice: keep what is paid above its balance as the customer's credit instead of refusing it. */
    keepExcessAsCredit: z.boolean().default(false),
    /** …or split across several. */
    allocations: z
      .array(z.object({ invoiceId: z.uuid({ error: 'Choose an invoice.' }), amountCents: z.number().int().min(1, 'Each part must be above zero.').max(100_000_000_00) }))
      .max(50)
      .optional(),
  })
  .refine((v) => (v.invoiceId && v.amountCents) || (v.allocations && v.allocations.length > 0), {
    message: 'Give an invoice and an amount, or split the payment across invoices.',
    path: ['amountCents'],
  });
export type RecordPaymentRequest = z.input<typeof RecordPaymentRequest>;

/** The latest of the invoices' issue dates (YYYY-MM-DD sorts as text); null when none is issued. */
export const latestIssueDate = (dates: readonly (string | null | undefined)[]): string | null =>
  dates.reduce<string | null>((latest, d) => (d && (!latest || d > latest) ? d : latest), null);

/**
 * What is wrong with a payment received on `receivedDay`, or null. Money is received on or after
 * the day the invoice was issued (with a split, the latest of them) and no later than tomorrow,
 * for a check handed over dated the next day; both days on the company's calendar.
 */
export function receivedDateProblem(receivedDay: string, bounds: { issueDate: string | null; today: string }): string | null {
  if (bounds.issueDate && receivedDay < bounds.issueDate) {
    return `The invoice was issued on ${bounds.issueDate}: enter a day on or after it.`;
  }
  const tomorrow = addDays(bounds.today, 1);
  if (receivedDay > tomorrow) return `Enter a day no later than tomorrow (${tomorrow}): the day the money came in.`;
  return null;
}

/**
 * RecordPaymentRequest with the received date's bounds, for a form that knows the invoices and the
 * company's calendar; the server checks the same bounds with `receivedDateProblem` on the locked
 * invoices.
 */
export const recordPaymentRequestFor = (context: { issueDateOf: (invoiceId: string) => string | null | undefined; today: string; timeZone: string }) =>
  RecordPaymentRequest.superRefine((v, ctx) => {
    const at = v.receivedAt ? Date.parse(v.receivedAt) : Number.NaN;
    if (Number.isNaN(at)) return;
    const ids = v.allocations?.length ? v.allocations.map((a) => a.invoiceId) : v.invoiceId ? [v.invoiceId] : [];
    const problem = receivedDateProblem(dateInZone(at, context.timeZone), { issueDate: latestIssueDate(ids.map(context.issueDateOf)), today: context.today });
    if (problem) ctx.addIssue({ code: 'custom', path: ['receivedAt'], message: problem });
  });

/**
 * How a payment came: money (cash, check, transfer, card), or moved from what the customer already
 * had with us: the security deposit held, or their account credit.
 */
export const RECEIPT_METHODS = ['cash', 'check', 'transfer', 'card', 'security_deposit', 'credit'] as const;
export type ReceiptMethod = (typeof RECEIPT_METHODS)[number];

export interface PaymentRow {
  id: string;
  bookingId: string;
  method: ReceiptMethod;
  amountCents: number;
  /** The part kept as the customer's credit (an overpayment), not applied to an invoice. */
  creditCents: number;
  reference: string;
  receivedAt: string;
  allocations: { invoiceId: string; invoiceNumber: string | null; amountCents: number }[];
  receiptDocumentId: string | null;
  recordedBy: string | null;
  /** Refunded so far (confirmed); at most amountCents - creditCents - refundedCents - pendingRefundCents can still go back. */
  refundedCents: number;
  /** Card refunds asked for and not yet confirmed by the card processor. */
  pendingRefundCents: number;
  /** Card payments: what the card processor kept of the amount; null when not known (and for other methods). */
  feeCents: number | null;
}

export interface LedgerEntryRow {
  id: string;
  occurredAt: string;
  kind: string;
  memo: string;
  lines: { accountCode: string; accountName: string; debitCents: number; creditCents: number }[];
}

/** GET /api/bookings/:id/ledger */
export interface BookingLedger {
  entries: LedgerEntryRow[];
  /** What the customer owes on the booking (accounts receivable). */
  balanceCents: number;
  invoicedCents: number;
  /** What credit notes took off the booking's invoices (the rest of them became account credit). */
  creditedCents: number;
  paidCents: number;
  securityDepositHeldCents: number;
  /** The customer's account credit (all bookings), usable on any of their invoices. */
  customerCreditCents: number;
}

/** POST /api/payments/:id/refunds (owner). */
export const RefundRequest = z.object({
  amountCents: z.number({ error: 'Enter the amount to refund.' }).int('Amounts are whole cents.').min(1, 'The amount must be above zero.').max(100_000_000_00),
  reason: z.string({ error: 'Say why.' }).trim().min(3, 'Say why the money goes back.').max(500),
});
export type RefundRequest = z.input<typeof RefundRequest>;

/** POST /api/bookings/:id/security-deposit: take it, give it back, or keep part for damage. */
export const SecurityDepositRequest = z
  .object({
    action: z.enum(['collect', 'refund', 'keep', 'apply'], { error: 'Choose collect, refund, keep or apply.' }),
    /** With `apply`: the (additional-charges) invoice the held deposit pays. */
    invoiceId: z.uuid({ error: 'Choose the invoice the deposit pays.' }).optional(),
    amountCents: z.number({ error: 'Enter the amount.' }).int('Amounts are whole cents.').min(1, 'The amount must be above zero.').max(100_000_000_00),
    method: z.enum(['cash', 'check', 'transfer', 'card'], { error: 'Choose how the money moved.' }).optional(),
    reason: z.string().trim().max(500).default(''),
  })
  .refine((v) => v.action === 'keep' || v.action === 'apply' || !!v.method, { path: ['method'], message: 'Choose how the money moved.' })
  .refine((v) => v.action !== 'apply' || !!v.invoiceId, { path: ['invoiceId'], message: 'Choose the invoice the deposit pays.' })
  .refine((v) => v.action !== 'keep' || v.reason.length >= 3, { path: ['reason'], message: 'Say what the deposit pays for (the damage).' });
export type SecurityDepositRequest = z.input<typeof SecurityDepositRequest>;

export interface AccountRow {
  id: string;
  code: string;
  name: string;
  type: 'asset' | 'liability' | 'equity' | 'revenue' | 'expense' | 'contra_revenue';
  /** The role the posting rules use this account for. */
  systemKey: string | null;
}

/** PUT /api/ledger/accounts/:id (owner): the company's own code and name for an account. */
export const AccountInput = z.object({
  code: z
    .string()
    .trim()
    .min(1, 'Give the account a code.')
    .max(10, 'At most 10 characters.')
    // Spreadsheets run a cell starting with these as a formula (OWASP, "CSV Injection"); the
    // exports defuse such cells anyway, but a code is a number to look up, never a formula.
    .regex(/^[^-+=@]/, 'Start the code with a digit or a letter: a code cannot start with -, +, = or @.')
    .regex(/^[0-9A-Za-z.-]+$/, 'Use digits, letters, dots and hyphens.'),
  name: z.string().trim().min(2, 'Give the account a name.').max(120),
});
export type AccountInput = z.input<typeof AccountInput>;

export interface StatementRow {
  entryId: string;
  occurredAt: string;
  kind: string;
  memo: string;
  bookingId: string | null;
  bookingReference: string | null;
  debitCents: number;
  creditCents: number;
  balanceCents: number;
}

/** GET /api/customers/:id/statement */
export interface CustomerStatement {
  customer: { id: string; name: string };
  lines: StatementRow[];
  balanceCents: number;
  currency: string;
}
