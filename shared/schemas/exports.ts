import { z } from 'zod';
import { ListQuery } from './common';

/**
 * The bookkeeper's exports (bookkeeper and owner). Each is a file streamed from the database:
 * CSVs (RFC 4180, UTF-8 with a byte order mark, CRLF) and ZIPs of PDFs or UBL 2.1 XML.
 */
export const EXPORT_KINDS = ['paid-invoices', 'invoice-lines', 'payments', 'journal', 'trial-balance', 'invoices', 'ubl'] as const;
export type ExportKind = (typeof EXPORT_KINDS)[number];

export const EXPORT_FORMATS: Record<ExportKind, 'csv' | 'zip'> = {
  'paid-invoices': 'csv',
  'invoice-lines': 'csv',
  payments: 'csv',
  journal: 'csv',
  'trial-balance': 'csv',
  invoices: 'zip',
  ubl: 'zip',
};

/** Exports that cover a range of dates; the trial balance is at one date (the range's end). */
export const isRangeExport = (kind: ExportKind) => kind !== 'trial-balance';

/** The download's address: `/api/exports/paid-invoices.csv?from=…&to=…`, `/api/exports/trial-balance.csv?at=…`. */
export function exportUrl(kind: ExportKind, from: string, to: string): string {
  const query = isRangeExport(kind) ? `from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}` : `at=${encodeURIComponent(to)}`;
  return `/api/exports/${kind}.${EXPORT_FORMATS[kind]}?${query}`;
}

/** `paid-invoices_2026-01-01_2026-01-31.csv`; the trial balance is named by its date only. */
export function exportFilename(kind: ExportKind, from: string | null, to: string): string {
  return isRangeExport(kind) && from ? `${kind}_${from}_${to}.${EXPORT_FORMATS[kind]}` : `${kind}_${to}.${EXPORT_FORMATS[kind]}`;
}

export const EXPORT_LABELS: Record<ExportKind, { title: string; description: string }> = {
  'paid-invoices': {
    title: 'Paid invoices',
    description: 'One row per invoice paid in full in the range (by the day it was paid in full), and per credit note issued in it: amounts by revenue account and by tax rate, total, and how it was paid.',
  },
  'invoice-lines': {
    title: 'Invoice lines',
    description: 'One row per line of the invoices and credit notes issued in the range, with its account; sales tax is a line of its own.',
  },
  payments: {
    title: 'Payments and refunds',
    description: 'Every payment, refund, security deposit taken or returned, and account credit paid back in the range: method, reference and card processor ids.',
  },
  journal: {
    title: 'General journal',
    description: 'One row per journal line in the range: date, entry number, account, debit, credit, memo and source document. Debits equal credits.',
  },
  'trial-balance': {
    title: 'Trial balance',
    description: 'Every account’s balance at the end of the range’s last day. The debit and credit columns are equal.',
  },
  invoices: {
    title: 'Invoice and receipt PDFs',
    description: 'The PDFs of the paid invoices and credit notes above and the receipts of their payments, as one ZIP, each file named by its number.',
  },
  ubl: {
    title: 'UBL 2.1 e-invoices',
    description: 'Each paid invoice as a UBL 2.1 Invoice (credit notes as CreditNote) XML file, in one ZIP, for accounting software that reads the open standard.',
  },
};

export const EXPORT_STATUSES = ['running', 'ok', 'failed', 'aborted'] as const;
export type ExportStatus = (typeof EXPORT_STATUSES)[number];
export const EXPORT_STATUS_LABELS: Record<ExportStatus, string> = {
  running: 'Running',
  ok: 'Finished',
  failed: 'Failed',
  aborted: 'Cancelled',
};

// Dates far outside what a rental company keeps books for are typing mistakes.
const inBooks = (d: string) => d >= '1900-01-01' && d <= '2999-12-31';

const day = (what: string) =>
  z.iso
    .date({ error: `Enter the ${what} as YYYY-MM-DD.` })
    .refine(inBooks, `Enter a ${what} between 1900 and 2999.`);

/** `?from=YYYY-MM-DD&to=YYYY-MM-DD`: both days included, on the company's calendar. */
export const ExportRangeQuery = z
  .object({ from: day('first day'), to: day('last day') })
  .refine((q) => q.to >= q.from, { path: ['to'], message: 'The last day must be on or after the first day.' });
export type ExportRangeQuery = z.infer<typeof ExportRangeQuery>;

/** `?at=YYYY-MM-DD`: the trial balance at the end of that day on the company's calendar. */
export const TrialBalanceExportQuery = z.object({ at: day('closing day') });
export type TrialBalanceExportQuery = z.infer<typeof TrialBalanceExportQuery>;

export const ExportKindParams = z.object({ kind: z.enum(EXPORT_KINDS, { error: 'Unknown export.' }) });

export const ExportHistoryQuery = ListQuery;

/** GET /api/exports/:kind/count: what the download will hold, so the screen can show progress. */
export interface ExportCount {
  kind: ExportKind;
  /** Data rows of a CSV (the header not counted), or files in a ZIP. */
  rows: number;
  /** The ZIP of PDFs: the bytes it will be, near enough (files are stored as they are). Null when not known ahead. */
  bytes: number | null;
}

/** GET /api/exports/history */
export interface ExportRunRow {
  id: string;
  kind: ExportKind;
  from: string | null;
  to: string;
  status: ExportStatus;
  rows: number;
  bytes: number;
  startedAt: string;
  finishedAt: string | null;
  /** Who ran it (null once that user is gone). */
  by: string | null;
  error: string | null;
  filename: string;
}
