import { formatMoney } from '@shared/money';
import type { QuoteResult } from '@shared/schemas/quote';
import { bpToPercentInput } from '@/lib/amounts';
import { formatCalendarDate } from '@/lib/zoned-time';

/** The live quote: the same calculation the server stores when the booking is saved. */
export function QuotePanel({ result, currency, taxExempt, saved }: { result: QuoteResult | null; currency: string; taxExempt: boolean; saved: QuoteResult | null }) {
  if (!result) return <p className="text-sm text-canvas-700">The quote shows once the amounts can be read.</p>;
  const m = (c: number) => formatMoney(c, currency);
  const rows: Array<[string, number, string?]> = [
    ['Rentals', result.rentalCents],
    ['Fees', result.feesCents],
    ['Discounts', -result.discountCents],
    ['Delivery', result.deliveryCents],
    ['Set-up labor', result.setupLaborCents],
    ['Damage waiver', result.damageWaiverCents],
  ];
  const differs = saved && saved.totalCents !== result.totalCents;
  return (
    <div className="space-y-4 text-sm">
      <dl className="divide-y divide-canvas-200">
        {rows.map(([label, cents]) => (
          <div key={label} className="flex justify-between gap-4 py-1.5">
            <dt className="text-canvas-700">{label}</dt>
            <dd className="tabular-nums">{cents < 0 ? `−${m(-cents)}` : m(cents)}</dd>
          </div>
        ))}
        <div className="flex justify-between gap-4 py-1.5 font-semibold">
          <dt>Subtotal</dt>
          <dd className="tabular-nums">{m(result.subtotalCents)}</dd>
        </div>
        <div className="flex justify-between gap-4 py-1.5">
          <dt className="text-canvas-700">
            Tax {taxExempt ? '(customer is tax exempt)' : `at ${bpToPercentInput(result.taxRateBp)}% on ${m(result.taxableCents)}`}
          </dt>
          <dd className="tabular-nums">{m(result.taxCents)}</dd>
        </div>
        <div className="flex justify-between gap-4 py-2 text-base font-bold">
          <dt>Total</dt>
          <dd className="tabular-nums" data-testid="quote-total">
            {m(result.totalCents)}
          </dd>
        </div>
        <div className="flex justify-between gap-4 py-1.5">
          <dt className="text-canvas-700">Deposit</dt>
          <dd className="tabular-nums">{m(result.depositCents)}</dd>
        </div>
        <div className="flex justify-between gap-4 py-1.5">
          <dt className="text-canvas-700">Balance</dt>
          <dd className="tabular-nums">{m(result.balanceCents)}</dd>
        </div>
        <div className="flex justify-between gap-4 py-1.5">
          <dt className="text-canvas-700">Refundable security deposit</dt>
          <dd className="tabular-nums">{m(result.securityDepositCents)}</dd>
        </div>
      </dl>
      {result.schedule.length ? (
        <div>
          <h3 className="mb-1 font-semibold text-canvas-900">Payment schedule</h3>
          <ul className="space-y-1">
            {result.schedule.map((s) => (
              <li key={s.kind} className="flex justify-between gap-4">
                <span>
                  {s.label}
                  {s.dueDate ? <span className="block text-xs text-canvas-600">{formatCalendarDate(s.dueDate)}</span> : null}
                </span>
                <span className="tabular-nums">{m(s.amountCents)}</span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {differs ? <p className="text-canvas-600">Saved total: {m(saved.totalCents)}. Save to update it.</p> : null}
    </div>
  );
}
