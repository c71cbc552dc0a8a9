import type { InvoiceRow, PaymentRow } from '../../shared/schemas/invoices';
import type { Booking, Customer, Invoice, Payment, PaymentAllocation, User } from '../models';
import { can } from '../policies';
import { payLinkEndsAt, payLinkUrl } from '../services/payLinks';
import { cardPaymentsEnabled } from '../services/stripe';

export function presentInvoice(
  invoice: Invoice,
  actor: User,
  extra: { booking: Pick<Booking, 'reference'>; customer: Pick<Customer, 'id' | 'name' | 'email'>; currency: string; today: string; creditsInvoiceNumber?: string | null },
): InvoiceRow {
  const balance = invoice.status === 'void' || invoice.kind === 'credit_note' ? 0 : invoice.totalCents - invoice.paidCents - invoice.creditedCents;
  const payable = balance > 0 && ['open', 'partly_paid'].includes(invoice.status) && cardPaymentsEnabled();
  return {
    id: invoice.id,
    bookingId: invoice.bookingId,
    bookingReference: extra.booking.reference,
    customer: { id: extra.customer.id, name: extra.customer.name, email: extra.customer.email },
    kind: invoice.kind,
    number: invoice.number ?? null,
    status: invoice.status,
    issueDate: invoice.issueDate ?? null,
    dueDate: invoice.dueDate ?? null,
    overdue: ['open', 'partly_paid'].includes(invoice.status) && !!invoice.dueDate && invoice.dueDate < extra.today,
    lines: invoice.lines,
    subtotalCents: invoice.totalCents - invoice.taxCents,
    taxCents: invoice.taxCents,
    totalCents: invoice.totalCents,
    paidCents: invoice.paidCents,
    creditedCents: invoice.creditedCents,
    creditNotesCents: invoice.creditNotesCents,
    balanceCents: balance,
    currency: extra.currency,
    documentId: invoice.documentId ?? null,
    voidReason: invoice.voidReason ?? null,
    creditsInvoice: invoice.creditsInvoiceId ? { id: invoice.creditsInvoiceId, number: extra.creditsInvoiceNumber ?? null } : null,
    reason: invoice.reason ?? null,
    payUrl: payable ? payLinkUrl(invoice.id, invoice.payLinkGeneration) : null,
    payLinkEndsAt: payable ? payLinkEndsAt().toISOString() : null,
    createdAt: invoice.createdAt.toISOString(),
    can: {
      issue: can(actor, 'invoice', 'issue', invoice),
      void: can(actor, 'invoice', 'void', invoice),
      recordPayment: can(actor, 'invoice', 'recordPayment', invoice),
      creditNote: can(actor, 'invoice', 'creditNote', invoice),
      // Paying from account credit is a payment like any other; the credit itself is checked when used.
      applyCredit: can(actor, 'invoice', 'recordPayment', invoice),
      revokePayLink: can(actor, 'invoice', 'revokePayLink', invoice),
    },
  };
}

export function presentPayment(
  payment: Payment,
  allocations: (PaymentAllocation & { number: string | null })[],
  recordedBy: string | null,
  refundedCents = 0,
  pendingRefundCents = 0,
): PaymentRow {
  return {
    id: payment.id,
    bookingId: payment.bookingId,
    method: payment.method,
    amountCents: payment.amountCents,
    creditCents: payment.creditCents,
    reference: payment.reference,
    receivedAt: payment.receivedAt.toISOString(),
    allocations: allocations.map((a) => ({ invoiceId: a.invoiceId, invoiceNumber: a.number, amountCents: a.amountCents })),
    receiptDocumentId: payment.receiptDocumentId ?? null,
    recordedBy,
    refundedCents,
    pendingRefundCents,
    feeCents: payment.feeCents ?? null,
  };
}
