/**
 * The customer's own pages ("Your rentals") and card payments. Customers have no password: an
 * e-mailed one-time link signs them in, and they see only the bookings whose customer record has
 * their e-mail address. Card numbers never reach Guyline: payment happens on the card
 * processor's hosted page.
 */
import { z } from 'zod';
import type { InvoiceKind, InvoiceStatus } from './invoices';

/** The cookie of a customer's session (separate from staff sessions). */
export const CUSTOMER_SESSION_COOKIE = 'guyline_customer';

/** POST /api/portal/sign-in: always 202, whether or not the address is known (no account probing). */
export const PortalSignInRequest = z.object({
  email: z.email({ error: 'Enter the e-mail address your rental company has for you.' }).trim().toLowerCase().max(254),
  /** Where the link should land after sign-in: a portal path such as /portal/bookings/<id>. */
  next: z.string().regex(/^\/portal(\/[A-Za-z0-9/_-]*)?$/, 'Unknown page.').max(200).optional(),
});
export type PortalSignInRequest = z.input<typeof PortalSignInRequest>;

/**
 * POST /api/portal/sessions: trades the link's one-time token for a session cookie; answers
 * PortalMe (with `next`). 404 `link_unknown`, 410 `link_used` or `link_expired` otherwise.
 */
export const PortalSessionRequest = z.object({
  token: z.string({ error: 'This sign-in link is incomplete.' }).min(20, 'This sign-in link is incomplete.').max(200),
});
export type PortalSessionRequest = z.input<typeof PortalSessionRequest>;

export interface PortalCompany {
  id: string;
  name: string;
  email: string;
  phone: string;
  address: string;
}

/** GET /api/portal/me */
export interface PortalMe {
  email: string;
  name: string;
  /** Where the sign-in link was meant to land, once, right after sign-in. */
  next: string | null;
  /** The one company whose pages these are: a customer of two companies signs in to each. */
  company: PortalCompany;
}

export interface PortalInvoice {
  id: string;
  number: string;
  kind: InvoiceKind;
  status: InvoiceStatus;
  issueDate: string;
  dueDate: string | null;
  overdue: boolean;
  totalCents: number;
  paidCents: number;
  creditedCents: number;
  balanceCents: number;
  documentId: string | null;
  /** A card payment can be started: an open balance and card payments switched on. */
  canPay: boolean;
}

export interface PortalBookingSummary {
  id: string;
  reference: string;
  status: string;
  eventStart: string;
  eventEnd: string;
  siteAddress: string;
  company: PortalCompany;
  balanceCents: number;
  currency: string;
  /** The company's time zone: dates and windows read on its clock. */
  timeZone: string;
  /** Something is waiting for the customer: an agreement to sign or an amount due. */
  needsAction: boolean;
}

export interface PortalBooking extends PortalBookingSummary {
  deliveryWindow: { start: string; end: string };
  pickupWindow: { start: string; end: string };
  guestCount: number;
  lines: { description: string; quantity: number }[];
  agreement:
    | { state: 'none' }
    /**
     * Sent for signature: a POST to signUrl answers the signing page's address. `changedSinceSigned`
     * names the version the customer signed before the booking changed.
     */
    | { state: 'awaiting'; signUrl: string; documentNumber: string; changedSinceSigned: { documentId: string; documentNumber: string } | null }
    | { state: 'signed'; documentId: string; documentNumber: string; signedAt: string };
  invoices: PortalInvoice[];
  receipts: { documentId: string; number: string; issuedAt: string }[];
  /** What the customer may pay now: the unpaid balance of every issued invoice. */
  dueNowCents: number;
  securityDepositHeldCents: number;
}

/** POST /api/portal/bookings/:id/sign: where the signing page of the current agreement is. */
export interface PortalSignStart {
  url: string;
}

/** POST /api/invoices/:id/checkout (staff or the invoice's customer) and POST /api/pay/:token/checkout. */
export const CheckoutRequest = z.object({
  /** Less than the balance for a part payment; the whole balance when left out. */
  amountCents: z.number({ error: 'Enter the amount.' }).int('Amounts are whole cents.').min(50, 'Card payments start at $0.50.').max(100_000_000_00).optional(),
});
export type CheckoutRequest = z.input<typeof CheckoutRequest>;
export interface CheckoutResponse {
  url: string;
  checkoutId: string;
}

export const CHECKOUT_STATUSES = ['open', 'paid', 'failed', 'expired'] as const;
export type CheckoutStatus = (typeof CHECKOUT_STATUSES)[number];

/**
 * GET /api/portal/checkouts/:id and GET /api/pay/:token/checkouts/:id: where a card payment
 * stands. `open` until the processor's confirmation arrives (the page polls); `failed` keeps the
 * invoice open and says why in plain words.
 */
export interface CheckoutState {
  id: string;
  status: CheckoutStatus;
  amountCents: number;
  currency: string;
  invoiceId: string;
  invoiceNumber: string;
  bookingId: string;
  /** Plain words for a decline, e.g. "Your card was declined: the bank says there are not enough funds." */
  message: string | null;
  receiptDocumentId: string | null;
}

/** GET /api/pay/:token: the invoice behind an e-mailed pay link, without signing in. */
export interface PayLink {
  invoice: PortalInvoice;
  bookingReference: string;
  eventStart: string;
  customerName: string;
  company: PortalCompany;
  currency: string;
  timeZone: string;
}
