import { formatMoney } from '@shared/money';
import type { InvoiceCategory, InvoiceRow } from '@shared/schemas/invoices';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { cn } from '@/lib/cn';
import { invoiceNumber } from './invoice-labels';

/** Where each line's money goes in the ledger, in the trade's words. */
export const INVOICE_CATEGORY_LABELS: Record<InvoiceCategory, string> = {
  rental: 'Rental',
  delivery_labor: 'Delivery and labor',
  damage_waiver: 'Damage waiver',
  damage: 'Damage recovery',
  tax: 'Sales tax',
};

/** The invoice's lines, then subtotal, tax, total, what credit notes took off, paid and the balance left. */
export function InvoiceLines({ invoice: i }: { invoice: InvoiceRow }) {
  const money = (cents: number) => formatMoney(cents, i.currency);
  const sums: [string, number, boolean][] = [
    ['Subtotal', i.subtotalCents, false],
    ['Tax', i.taxCents, false],
    ['Total', i.totalCents, true],
  ];
  // A credit note is settled when issued: nothing is paid on it and nothing is owed.
  if (i.kind !== 'credit_note') {
    if (i.creditedCents > 0) sums.push(['Credited', i.creditedCents, false]);
    sums.push(['Paid', i.paidCents, false], ['Balance', i.balanceCents, true]);
  }
  return (
    <Table caption={`Lines of invoice ${invoiceNumber(i)}`}>
      <THead>
        <Tr>
          <Th>Description</Th>
          <Th>Category</Th>
          <Th className="text-right">Amount</Th>
        </Tr>
      </THead>
      <TBody>
        {i.lines.map((line, index) => (
          <Tr key={index}>
            <Td className="min-w-48">{line.description}</Td>
            <Td className="whitespace-nowrap">{INVOICE_CATEGORY_LABELS[line.category] ?? line.category}</Td>
            <Td className="text-right whitespace-nowrap tabular-nums">{money(line.amountCents)}</Td>
          </Tr>
        ))}
      </TBody>
      <tfoot className="border-t-2 border-canvas-300 bg-canvas-50">
        {sums.map(([label, cents, strong]) => (
          <Tr key={label}>
            <Th scope="row" colSpan={2} className={cn('text-right', strong ? 'text-canvas-900' : 'font-normal text-canvas-700')}>
              {label}
            </Th>
            <Td className={cn('py-2 text-right whitespace-nowrap tabular-nums', strong && 'font-semibold')}>{money(cents)}</Td>
          </Tr>
        ))}
      </tfoot>
    </Table>
  );
}
