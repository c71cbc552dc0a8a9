import { Link } from 'react-router';
import { formatMoney } from '@shared/money';
import type { CustomerStatement } from '@shared/schemas/invoices';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { formatZoned } from '@/lib/zoned-time';
import { kindText } from './ledger-labels';

interface StatementTableProps {
  statement: CustomerStatement;
  timeZone: string;
  /** Links to bookings only for those who may open them. */
  linkBookings: boolean;
}

/**
 * The customer's account line by line, oldest first: what was charged, what was paid or
 * credited, and the balance after each line; the closing balance at the foot.
 */
export function StatementTable({ statement: s, timeZone, linkBookings }: StatementTableProps) {
  const money = (cents: number) => formatMoney(cents, s.currency);
  // A negative balance is money the company owes the customer.
  const balanceText = (cents: number) => (cents < 0 ? `${money(-cents)} in credit` : money(cents));
  return (
    <Table caption={`Statement for ${s.customer.name}`} className="print:overflow-visible print:border-0">
      <THead>
        <Tr>
          <Th>Date</Th>
          <Th>Booking</Th>
          <Th>What</Th>
          <Th className="text-right">Charged</Th>
          <Th className="text-right">Paid or credited</Th>
          <Th className="text-right">Balance</Th>
        </Tr>
      </THead>
      <TBody>
        {s.lines.map((line) => {
          const kind = kindText(line.kind);
          return (
            <Tr key={line.entryId} className="break-inside-avoid">
              <Th scope="row" className="py-3 font-normal whitespace-nowrap">
                {formatZoned(line.occurredAt, timeZone, false)}
              </Th>
              <Td className="whitespace-nowrap">
                {!line.bookingId || !line.bookingReference ? (
                  '—'
                ) : linkBookings ? (
                  <Link className={linkClasses} to={paths.app.booking.getHref(line.bookingId)}>
                    {line.bookingReference}
                  </Link>
                ) : (
                  line.bookingReference
                )}
              </Td>
              <Td className="min-w-48">
                <span className="font-semibold text-canvas-900">{kind}</span>
                {line.memo && line.memo !== kind ? <span className="block text-canvas-700">{line.memo}</span> : null}
              </Td>
              <Td className="text-right whitespace-nowrap tabular-nums">{line.debitCents ? money(line.debitCents) : ''}</Td>
              <Td className="text-right whitespace-nowrap tabular-nums">{line.creditCents ? money(line.creditCents) : ''}</Td>
              <Td className="text-right whitespace-nowrap tabular-nums">{balanceText(line.balanceCents)}</Td>
            </Tr>
          );
        })}
      </TBody>
      <tfoot className="border-t-2 border-canvas-300 bg-canvas-50">
        <Tr>
          <Th scope="row" colSpan={5} className="py-3 text-right text-canvas-900">
            Closing balance
          </Th>
          <Td className="py-3 text-right text-base font-semibold whitespace-nowrap text-canvas-900 tabular-nums">{balanceText(s.balanceCents)}</Td>
        </Tr>
      </tfoot>
    </Table>
  );
}
