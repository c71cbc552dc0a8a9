import { Link } from 'react-router';
import { formatMoney } from '@shared/money';
import type { PaymentRow } from '@shared/schemas/invoices';
import { Button } from '@/components/ui/button';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { formatZoned } from '@/lib/zoned-time';
import { documentPdfUrl } from '@/features/documents/api/get-document-pdf';
import { canRefundPayment, PAYMENT_METHOD_LABELS } from './invoice-labels';

interface PaymentsTableProps {
  payments: readonly PaymentRow[];
  currency: string;
  timeZone: string;
  caption: string;
  /** On an invoice's page: show only what each payment put on that invoice. */
  invoiceId?: string;
  /** For the owner: a Refund button on each payment that has money left to give back. */
  onRefund?: (payment: PaymentRow) => void;
}

/**
 * Payments received: when, how, the reference, how much went where (and, for a card payment, the
 * processor's fee when known), and the receipt. Only people who see invoices see this table: the
 * crew never does.
 */
export function PaymentsTable({ payments, currency, timeZone, caption, invoiceId, onRefund }: PaymentsTableProps) {
  return (
    <Table caption={caption}>
      <THead>
        <Tr>
          <Th>Received</Th>
          <Th>Method</Th>
          <Th>Reference</Th>
          <Th className="text-right">Amount</Th>
          {invoiceId ? null : <Th>Paid on</Th>}
          <Th>Receipt</Th>
          {onRefund ? (
            <Th>
              <span className="sr-only">Refund</span>
            </Th>
          ) : null}
        </Tr>
      </THead>
      <TBody>
        {payments.map((p) => {
          const here = invoiceId ? p.allocations.find((a) => a.invoiceId === invoiceId) : undefined;
          const when = formatZoned(p.receivedAt, timeZone);
          return (
            <Tr key={p.id}>
              <Th scope="row" className="py-3 font-normal whitespace-nowrap">
                {when}
                {p.recordedBy ? <span className="block text-xs text-canvas-600">by {p.recordedBy}</span> : null}
              </Th>
              <Td className="whitespace-nowrap">{PAYMENT_METHOD_LABELS[p.method] ?? p.method}</Td>
              <Td className="min-w-24 break-words">{p.reference || '—'}</Td>
              <Td className="text-right whitespace-nowrap tabular-nums">
                {formatMoney(here ? here.amountCents : p.amountCents, currency)}
                {here && here.amountCents !== p.amountCents ? <span className="block text-xs text-canvas-600">of {formatMoney(p.amountCents, currency)}</span> : null}
                {p.feeCents !== null && p.feeCents > 0 ? (
                  <span className="block text-xs text-canvas-600">
                    fee {formatMoney(p.feeCents, currency)}
                    <span className="sr-only"> kept by the card processor</span>
                  </span>
                ) : null}
                {p.refundedCents > 0 ? <span className="block text-xs text-canvas-600">{formatMoney(p.refundedCents, currency)} refunded</span> : null}
                {p.pendingRefundCents > 0 ? (
                  <span className="block text-xs text-ochre-800">{formatMoney(p.pendingRefundCents, currency)} refund on its way to the card</span>
                ) : null}
              </Td>
              {invoiceId ? null : (
                <Td>
                  <ul className="space-y-0.5">
                    {p.allocations.map((a) => (
                      <li key={a.invoiceId} className="whitespace-nowrap">
                        <Link className={linkClasses} to={paths.app.invoice.getHref(a.invoiceId)}>
                          {a.invoiceNumber ?? 'Draft'}
                        </Link>{' '}
                        <span className="tabular-nums">{formatMoney(a.amountCents, currency)}</span>
                      </li>
                    ))}
                    {p.creditCents > 0 ? (
                      <li className="whitespace-nowrap">
                        Kept as credit <span className="tabular-nums">{formatMoney(p.creditCents, currency)}</span>
                      </li>
                    ) : null}
                  </ul>
                </Td>
              )}
              <Td className="whitespace-nowrap">
                {p.receiptDocumentId ? (
                  <a className={linkClasses} href={documentPdfUrl(p.receiptDocumentId)} download>
                    Download<span className="sr-only"> the receipt for the payment of {when}</span>
                  </a>
                ) : (
                  <span className="text-canvas-600">Being made</span>
                )}
              </Td>
              {onRefund ? (
                <Td className="whitespace-nowrap">
                  {canRefundPayment(p) ? (
                    <Button size="sm" variant="secondary" onClick={() => onRefund(p)}>
                      Refund<span className="sr-only"> the payment of {when}</span>
                    </Button>
                  ) : null}
                </Td>
              ) : null}
            </Tr>
          );
        })}
      </TBody>
    </Table>
  );
}
