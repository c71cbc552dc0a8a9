import { Link } from 'react-router';
import { BOOKING_STATUS_LABELS, type BookingStatus } from '@shared/schemas/bookings';
import type { DepositsReport, HeldSection } from '@shared/schemas/reports';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { formatCalendarDate } from '@/lib/zoned-time';
import { EntriesFigure } from './figure-button';
import { LedgerCheckNote } from './ledger-check';
import { moneyIn } from './report-format';

function Section({ id, title, description, section, byCustomer, at, empty, earnedSoon }: { id: string; title: string; description: string; section: HeldSection; byCustomer?: boolean; at: string; empty: string; earnedSoon?: boolean }) {
  return (
    <section aria-labelledby={id} className="space-y-2">
      <h3 id={id} className="text-lg font-semibold text-canvas-900">
        {title}
      </h3>
      <p className="max-w-prose text-sm text-canvas-700">{description}</p>
      {section.rows.length === 0 ? (
        <p className="rounded-md border border-dashed border-canvas-300 bg-canvas-50 px-4 py-3 text-sm text-canvas-700">{empty}</p>
      ) : (
        <Table caption={`${title} on ${formatCalendarDate(at)}`}>
          <THead>
            <Tr>
              {byCustomer ? null : <Th>Booking</Th>}
              <Th>Customer</Th>
              {byCustomer ? null : <Th>Event</Th>}
              <Th className="text-right">Held</Th>
            </Tr>
          </THead>
          <TBody>
            {section.rows.map((row, i) => (
              <Tr key={row.booking?.id ?? row.customer?.id ?? i}>
                {byCustomer ? null : (
                  <Th scope="row" className="py-3">
                    {row.booking ? (
                      <>
                        <Link className={linkClasses} to={paths.app.booking.getHref(row.booking.id)}>
                          {row.booking.reference}
                        </Link>
                        <span className="block text-xs font-normal text-canvas-700">{BOOKING_STATUS_LABELS[row.booking.status as BookingStatus] ?? row.booking.status}</span>
                      </>
                    ) : (
                      'No booking'
                    )}
                  </Th>
                )}
                {byCustomer ? (
                  <Th scope="row" className="py-3">
                    {row.customer ? (
                      <Link className={linkClasses} to={paths.app.customerStatement.getHref(row.customer.id)}>
                        {row.customer.name}
                      </Link>
                    ) : (
                      'No customer'
                    )}
                  </Th>
                ) : (
                  <Td>
                    {row.customer ? (
                      <Link className={linkClasses} to={paths.app.customerStatement.getHref(row.customer.id)}>
                        {row.customer.name}
                      </Link>
                    ) : (
                      '—'
                    )}
                  </Td>
                )}
                {byCustomer ? null : (
                  <Td className="whitespace-nowrap">
                    {row.booking ? formatCalendarDate(row.booking.eventDate) : '—'}
                    {/* Deposits move to revenue on the event day (the hourly recognition run): one still here was not moved yet. */}
                    {earnedSoon && row.booking && row.booking.eventDate <= at && row.booking.status !== 'cancelled' ? (
                      <span className="block text-xs text-ochre-800">Event held: not yet moved to revenue</span>
                    ) : null}
                  </Td>
                )}
                <Td className="text-right whitespace-nowrap">
                  <EntriesFigure cents={row.cents} trace={row.trace} what={`${title}, ${row.booking?.reference ?? row.customer?.name ?? 'unassigned'}`} />
                </Td>
              </Tr>
            ))}
          </TBody>
          <tfoot className="border-t-2 border-canvas-300 bg-canvas-50">
            <Tr>
              <Th scope="row" className="py-3" colSpan={byCustomer ? 1 : 3}>
                Total
              </Th>
              <Td className="text-right whitespace-nowrap">
                <TotalCell section={section} />
              </Td>
            </Tr>
          </tfoot>
        </Table>
      )}
      <LedgerCheckNote check={section.check} measure={`balance at the end of ${formatCalendarDate(at)}`} testId={`${id}-check`} />
    </section>
  );
}

function TotalCell({ section }: { section: HeldSection }) {
  return <EntriesFigure cents={section.totalCents} trace={section.check.trace} what={`${section.account.code} ${section.account.name}, all of it`} />;
}

/** What the company holds that is not yet its own: deposits until the event, security deposits until settled, and account credit. */
export function DepositsReportView({ report: r }: { report: DepositsReport }) {
  const money = moneyIn(r.currency);
  return (
    <section aria-labelledby="deposits-heading" className="space-y-6">
      <div>
        <h2 id="deposits-heading" className="text-xl font-semibold text-canvas-900">
          Deposits and security deposits held
        </h2>
        <p className="mt-1 max-w-prose text-sm text-canvas-700">
          On {formatCalendarDate(r.at)} the company holds <strong className="tabular-nums text-canvas-900">{money(r.totalCents)}</strong> that it owes back or has not
          yet earned: {money(r.customerDeposits.totalCents)} of deposits, {money(r.securityDeposits.totalCents)} of security deposits and{' '}
          {money(r.customerCredit.totalCents)} of account credit.
        </p>
      </div>
      <Section
        id="held-deposits"
        title="Customer deposits"
        description="Billed or paid before the event: not revenue until the event day, when it moves to the revenue accounts."
        section={r.customerDeposits}
        at={r.at}
        earnedSoon
        empty="No deposits are held for events still to come."
      />
      <Section
        id="held-security"
        title="Security deposits"
        description="Refundable deposits taken against damage: the customer’s money until returned, kept for damage or applied to an invoice."
        section={r.securityDeposits}
        at={r.at}
        empty="No security deposit is held."
      />
      <Section
        id="held-credit"
        title="Account credit"
        description="Overpayments and credit notes on paid invoices: owed to the customer, to use on a later invoice or to be paid back."
        section={r.customerCredit}
        byCustomer
        at={r.at}
        empty="No customer has account credit."
      />
    </section>
  );
}
