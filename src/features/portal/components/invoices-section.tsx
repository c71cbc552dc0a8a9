import type { PortalBooking } from '@shared/schemas/portal';
import { InvoiceCard } from './invoice-card';
import { money } from './labels';

/** Every invoice of the booking, newest last, each with its own Pay. */
export function InvoicesSection({ booking }: { booking: PortalBooking }) {
  return (
    <section aria-labelledby="invoices-heading" className="rounded-lg border border-canvas-200 bg-white p-4 shadow-sm sm:p-6">
      <h2 id="invoices-heading" tabIndex={-1} className="text-lg font-semibold text-canvas-900 focus:outline-none">
        Invoices and payments
      </h2>
      {booking.invoices.length === 0 ? (
        <p className="mt-2 text-canvas-700">No invoices yet. {booking.company.name} sends them as your booking is confirmed.</p>
      ) : (
        <>
          <p className="mt-1 text-sm text-canvas-700">
            {booking.balanceCents > 0 ? (
              <>
                Invoiced and not yet paid: <strong className="text-canvas-900 tabular-nums">{money(booking.balanceCents, booking.currency)}</strong>
                {booking.dueNowCents > 0 && booking.dueNowCents !== booking.balanceCents ? (
                  <>
                    , of which <strong className="text-canvas-900 tabular-nums">{money(booking.dueNowCents, booking.currency)}</strong> is due now
                  </>
                ) : null}
                .
              </>
            ) : (
              'Everything invoiced so far is paid. Thank you.'
            )}
          </p>
          <ul className="mt-4 space-y-3">
            {booking.invoices.map((invoice) => (
              <InvoiceCard
                key={invoice.id}
                invoice={invoice}
                bookingId={booking.id}
                currency={booking.currency}
                timeZone={booking.timeZone}
                companyName={booking.company.name}
              />
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
