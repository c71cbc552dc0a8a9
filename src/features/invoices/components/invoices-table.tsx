import { Link } from 'react-router';
import { formatMoney } from '@shared/money';
import { INVOICE_KIND_LABELS, type InvoiceRow } from '@shared/schemas/invoices';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { cn } from '@/lib/cn';
import { formatInvoiceDate, InvoiceStatusBadges, invoiceNumber } from './invoice-labels';

interface InvoicesTableProps {
  invoices: readonly InvoiceRow[];
  timeZone: string;
  /** Links to bookings only for those who may open them. */
  linkBookings: boolean;
  caption?: string;
}

export function InvoicesTable({ invoices, timeZone, linkBookings, caption = 'Invoices' }: InvoicesTableProps) {
  return (
    <Table caption={caption}>
      <THead>
        <Tr>
          <Th>Invoice</Th>
          <Th>Booking</Th>
          <Th>Customer</Th>
          <Th>Issued</Th>
          <Th>Due</Th>
          <Th className="text-right">Total</Th>
          <Th className="text-right">Paid</Th>
          <Th className="text-right">Balance</Th>
          <Th>Status</Th>
        </Tr>
      </THead>
      <TBody>
        {invoices.map((i) => (
          <Tr key={i.id}>
            <Th scope="row" className="py-3">
              <Link className={linkClasses} to={paths.app.invoice.getHref(i.id)}>
                {invoiceNumber(i)}
                {i.number ? null : <span className="sr-only"> of {i.bookingReference}</span>}
              </Link>
              {/* The kind under the number: one column less, so the table fits a laptop's width. */}
              <span className="block text-xs font-normal text-canvas-600">{INVOICE_KIND_LABELS[i.kind]}</span>
            </Th>
            <Td className="whitespace-nowrap">
              {linkBookings ? (
                <Link className={linkClasses} to={paths.app.booking.getHref(i.bookingId)}>
                  {i.bookingReference}
                </Link>
              ) : (
                i.bookingReference
              )}
            </Td>
            <Td>{i.customer.name}</Td>
            <Td className="whitespace-nowrap">{formatInvoiceDate(i.issueDate, timeZone) || '—'}</Td>
            <Td className={cn('whitespace-nowrap', i.overdue && 'font-semibold text-rust-700')}>
              {formatInvoiceDate(i.dueDate, timeZone) || '—'}
              {i.overdue ? <span className="block text-xs">Overdue</span> : null}
            </Td>
            {/* A credit note lowers what is owed: its total reads as minus; nothing is paid or owed on it. */}
            <Td className="text-right whitespace-nowrap tabular-nums">{formatMoney(i.kind === 'credit_note' ? -i.totalCents : i.totalCents, i.currency)}</Td>
            <Td className="text-right whitespace-nowrap tabular-nums">{i.kind === 'credit_note' ? '—' : formatMoney(i.paidCents, i.currency)}</Td>
            <Td className="text-right font-semibold whitespace-nowrap tabular-nums">{i.kind === 'credit_note' ? '—' : formatMoney(i.balanceCents, i.currency)}</Td>
            <Td>
              <InvoiceStatusBadges invoice={i} />
            </Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
