import type { ReactNode } from 'react';
import type { PortalBooking } from '@shared/schemas/portal';
import { buttonClasses } from '@/components/ui/button';
import { SectionCard } from '@/components/ui/card';
import { DocumentLink } from './document-link';
import { SignButton } from './sign-button';
import { formatDay, formatSpan, money, zoneName } from './labels';

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="py-2 sm:grid sm:grid-cols-[9rem_1fr] sm:gap-4">
      <dt className="text-sm font-semibold text-canvas-700">{term}</dt>
      <dd className="mt-0.5 text-canvas-900 sm:mt-0">{children}</dd>
    </div>
  );
}

/** When and where, on the company's clock (said once, below). */
export function WhenAndWhere({ booking }: { booking: PortalBooking }) {
  const zone = booking.timeZone;
  return (
    <SectionCard title="When and where">
      <dl className="divide-y divide-canvas-200">
        <Row term="Your event">{formatSpan(booking.eventStart, booking.eventEnd, zone)}</Row>
        <Row term="Delivery and set-up">
          {formatSpan(booking.deliveryWindow.start, booking.deliveryWindow.end, zone)}
          <span className="block text-sm text-canvas-600">We arrive some time in this window.</span>
        </Row>
        <Row term="Pickup">{formatSpan(booking.pickupWindow.start, booking.pickupWindow.end, zone)}</Row>
        <Row term="Where">{booking.siteAddress ? <span className="whitespace-pre-line">{booking.siteAddress}</span> : 'To be confirmed'}</Row>
        {booking.guestCount > 0 ? <Row term="Guests">{booking.guestCount}</Row> : null}
      </dl>
      <p className="mt-3 text-sm text-canvas-600">Times are {zoneName(zone, booking.eventStart)}.</p>
    </SectionCard>
  );
}

export function WhatYouRent({ booking }: { booking: PortalBooking }) {
  return (
    <SectionCard title="What you are renting">
      {booking.lines.length === 0 ? (
        <p className="text-canvas-700">The list of items is still being put together.</p>
      ) : (
        <ul className="divide-y divide-canvas-200">
          {booking.lines.map((line, i) => (
            <li key={i} className="flex items-baseline gap-3 py-2">
              <span className="min-w-10 text-right font-semibold text-canvas-900 tabular-nums">{line.quantity}×</span>
              <span className="text-canvas-900">{line.description}</span>
            </li>
          ))}
        </ul>
      )}
    </SectionCard>
  );
}

export function AgreementSection({ booking }: { booking: PortalBooking }) {
  const a = booking.agreement;
  return (
    <SectionCard title="Rental agreement">
      {a.state === 'awaiting' ? (
        <>
          {a.changedSinceSigned ? (
            <>
              <p className="text-canvas-800">
                Your booking changed after you signed agreement {a.changedSinceSigned.documentNumber}, so that signature no longer covers it. Please read and
                sign the new version, {a.documentNumber}.
              </p>
              <DocumentLink className="mt-3" documentId={a.changedSinceSigned.documentId} label={`What you signed before (${a.changedSinceSigned.documentNumber}, PDF)`} />
            </>
          ) : (
            <p className="text-canvas-800">Your rental agreement {a.documentNumber} is ready for you to read and sign. It takes a few minutes.</p>
          )}
          <SignButton className="mt-4 block" signUrl={a.signUrl} />
        </>
      ) : a.state === 'signed' ? (
        <>
          <p className="text-canvas-800">
            You signed agreement {a.documentNumber} on {formatDay(a.signedAt, booking.timeZone)}. Thank you.
          </p>
          <DocumentLink className="mt-4" documentId={a.documentId} label="Download your signed copy (PDF)" />
        </>
      ) : (
        <p className="text-canvas-700">No agreement has been sent yet. {booking.company.name} e-mails it to you when it is ready.</p>
      )}
    </SectionCard>
  );
}

export function ReceiptsSection({ booking }: { booking: PortalBooking }) {
  return (
    <SectionCard title="Receipts">
      {booking.receipts.length === 0 ? (
        <p className="text-canvas-700">No payments yet. A receipt appears here after each payment, and one is e-mailed to you.</p>
      ) : (
        <ul className="space-y-2">
          {booking.receipts.map((r) => (
            <li key={r.documentId} className="flex flex-wrap items-center justify-between gap-2">
              <span className="text-canvas-900">
                Receipt {r.number} <span className="text-sm text-canvas-600">· {formatDay(r.issuedAt, booking.timeZone)}</span>
              </span>
              <DocumentLink documentId={r.documentId} label={`Download receipt ${r.number} (PDF)`} />
            </li>
          ))}
        </ul>
      )}
      {booking.securityDepositHeldCents > 0 ? (
        <p className="mt-4 text-sm text-canvas-700">
          {booking.company.name} holds a refundable security deposit of {money(booking.securityDepositHeldCents, booking.currency)} for this booking. It is
          settled after the pickup.
        </p>
      ) : null}
    </SectionCard>
  );
}

/** What the customer has to do, at the top: sign, pay. */
export function ToDo({ booking }: { booking: PortalBooking }) {
  const sign = booking.agreement.state === 'awaiting' ? booking.agreement : null;
  const due = booking.dueNowCents > 0;
  if (!sign && !due) return null;
  return (
    <section aria-labelledby="todo-heading" className="rounded-lg border border-ochre-200 bg-ochre-50 p-4 sm:p-5">
      <h2 id="todo-heading" className="font-semibold text-ochre-800">
        Waiting for you
      </h2>
      <ul className="mt-2 space-y-2 text-canvas-900">
        {sign ? (
          <li className="flex flex-wrap items-center justify-between gap-2">
            <span>{sign.changedSinceSigned ? 'Your booking changed since you signed: sign the new version of your agreement.' : 'Sign your rental agreement.'}</span>
            <SignButton size="sm" signUrl={sign.signUrl} />
          </li>
        ) : null}
        {due ? (
          <li className="flex flex-wrap items-center justify-between gap-2">
            <span>
              <strong className="tabular-nums">{money(booking.dueNowCents, booking.currency)}</strong> to pay now.
            </span>
            <a className={buttonClasses('secondary', 'sm')} href="#invoices-heading">
              See how to pay
            </a>
          </li>
        ) : null}
      </ul>
    </section>
  );
}
