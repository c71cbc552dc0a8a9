import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { formatMoney } from '@shared/money';
import { quote } from '@shared/quote';
import { BookingInput, type BookingRow, type ShortfallDetail } from '@shared/schemas/bookings';
import type { ItemRow } from '@shared/schemas/items';
import type { PlannerLine } from '@shared/schemas/planner';
import { QuoteRequest, type QuoteResult } from '@shared/schemas/quote';
import type { CompanyRules } from '@shared/schemas/rules';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SectionCard } from '@/components/ui/card';
import { TextArea } from '@/components/ui/textarea';
import { bpToPercentInput } from '@/lib/amounts';
import { errorMessage, isApiError } from '@/lib/api';
import { zodFieldErrors, type FieldErrors } from '@/lib/form';
import { useDebounced } from '@/lib/use-debounced';
import { zonedInputToIso } from '@/lib/zoned-time';
// The planner panel is its own feature; the editor hands it the guest details and takes its lines.
import { PlannerPanel } from '@/features/planner/components/planner-panel';
import { shortfallsOf } from '../../api/change-booking-status';
import { useAvailabilityCheck, type AvailabilityCheck } from '../../api/check-availability';
import { useCreateBooking } from '../../api/create-booking';
import { useUpdateBooking } from '../../api/update-booking';
import { CustomerPicker } from './customer-picker';
import { ChargeFields, GuestFields, SiteFields, WindowFields } from './detail-fields';
import { emptyBooking, lineFromItem, newKey, quoteRequestOf, stateFromBooking, toBookingInput, type BookingState } from './editor-state';
import { HistoryList } from './history-list';
import { LinesTable } from './lines-table';
import { QuotePanel } from './quote-panel';
import { ShortfallDialog, StatusActions } from './status-actions';

/** Fields typed in dollars or percent whose schema path has another name. */
const ERROR_KEY: Partial<Record<keyof BookingState, string>> = {
  setupLabor: 'setupLaborCents',
  discountPercent: 'discountBp',
  discountAmount: 'discountCents',
  taxRatePercent: 'taxRateBp',
  securityDeposit: 'securityDepositCents',
};

interface BookingEditorProps {
  booking: BookingRow | null;
  items: readonly ItemRow[];
  rules: CompanyRules;
  timeZone: string;
  currency: string;
  /** For a new booking: who may see prices (the server says so per booking once saved). */
  seePrices: boolean;
  initialCustomerId?: string;
  onCreated?: (booking: BookingRow) => void;
  /** The page puts other features beside a saved booking (its documents); they need to know about unsaved edits. */
  documents?: (state: { dirty: boolean }) => ReactNode;
}

export function BookingEditor({ booking, items, rules, timeZone, currency, seePrices: seePricesNew, initialCustomerId, onCreated, documents }: BookingEditorProps) {
  const initial = useMemo(() => (booking ? stateFromBooking(booking, timeZone) : emptyBooking(initialCustomerId)), [booking, timeZone, initialCustomerId]);
  const [state, setState] = useState<BookingState>(initial);
  const [baseline, setBaseline] = useState(initial);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [taxExempt, setTaxExempt] = useState(booking?.customer.taxExempt ?? false);
  const [openSided, setOpenSided] = useState(false);
  const [shortfalls, setShortfalls] = useState<ShortfallDetail[] | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const create = useCreateBooking();
  const update = useUpdateBooking();
  const saving = create.isPending || update.isPending;

  const readOnly = booking ? !booking.can.update : false;
  const seePrices = booking ? booking.can.seePrices : seePricesNew;

  // A saved or re-loaded booking (after a save or a status change) becomes the new starting point.
  const loadedAt = booking?.updatedAt;
  useEffect(() => {
    if (!booking) return;
    const next = stateFromBooking(booking, timeZone);
    setState(next);
    setBaseline(next);
    setTaxExempt(booking.customer.taxExempt);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [loadedAt]);

  const dirty = JSON.stringify(state) !== JSON.stringify(baseline);
  const set = (patch: Partial<BookingState>) => {
    setSaved(null);
    setErrors((prev) => {
      const next = { ...prev };
      for (const key of Object.keys(patch) as (keyof BookingState)[]) {
        if (key === 'lines') {
          // Only the lines that changed lose their messages.
          patch.lines!.forEach((line, i) => {
            if (JSON.stringify(line) !== JSON.stringify(state.lines[i])) for (const e of Object.keys(next)) if (e.startsWith(`lines.${i}.`)) delete next[e];
          });
          delete next.lines;
        } else {
          delete next[key];
          delete next[ERROR_KEY[key] ?? key];
        }
      }
      return next;
    });
    setState((prev) => ({ ...prev, ...patch }));
  };

  // Live availability: the catalog lines over delivery-to-pickup, asked once typing settles.
  const check = useMemo<AvailabilityCheck | null>(() => {
    const from = zonedInputToIso(state.deliveryStart, timeZone);
    const to = zonedInputToIso(state.pickupEnd, timeZone);
    if (!from || !to || Date.parse(to) <= Date.parse(from)) return null;
    const sums = new Map<string, number>();
    for (const l of state.lines) if (l.itemId) sums.set(l.itemId, (sums.get(l.itemId) ?? 0) + (Number.parseInt(l.quantity, 10) || 0));
    return { from, to, excludeBookingId: booking?.id, lines: [...sums].map(([itemId, quantity]) => ({ itemId, quantity })) };
  }, [state.deliveryStart, state.pickupEnd, state.lines, timeZone, booking?.id]);
  const settledCheck = useDebounced(check, 500);
  const live = useAvailabilityCheck(settledCheck);
  const availability = useMemo(() => {
    const map = new Map<string, { available: number; shortfall: number }>();
    if (live.data && settledCheck) for (const d of live.data.data) map.set(d.itemId, d);
    else if (booking) for (const l of booking.lines) if (l.itemId && l.available !== null) map.set(l.itemId, { available: l.available, shortfall: l.shortfall });
    return map;
  }, [live.data, settledCheck, booking]);
  const short = [...availability.entries()].filter(([id, a]) => a.shortfall > 0 && state.lines.some((l) => l.itemId === id));

  // The live quote, with the same function and rules the server uses.
  const liveQuote = useMemo<QuoteResult | null>(() => {
    if (!seePrices) return null;
    const request = quoteRequestOf(state, rules, taxExempt, timeZone);
    const parsed = request ? QuoteRequest.safeParse(request) : null;
    if (!parsed?.success) return null;
    try {
      return quote(parsed.data);
    } catch {
      return null;
    }
  }, [state, rules, taxExempt, timeZone, seePrices]);

  const lineTotals = useMemo(() => {
    // The quote skips lines it cannot read, so match its results to lines by position among the readable ones.
    if (!liveQuote) return state.lines.map(() => null);
    const c = toBookingInput(state, timeZone);
    let j = 0;
    return state.lines.map((_, i) => (Object.keys(c.errors).some((k) => k.startsWith(`lines.${i}.`)) ? null : (liveQuote.lines[j++]?.netCents ?? null)));
  }, [liveQuote, state, timeZone]);

  const focusFirstInvalid = () =>
    requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());

  const showServerError = (error: unknown) => {
    setFormError(errorMessage(error));
    if (isApiError(error) && Object.keys(error.fields).length) {
      setErrors(error.fields);
      focusFirstInvalid();
    }
    const s = shortfallsOf(error);
    if (s) setShortfalls(s);
  };

  const submit = (event: React.FormEvent) => {
    event.preventDefault();
    setSaved(null);
    setFormError(null);
    const c = toBookingInput(state, timeZone, seePrices ? null : booking);
    const result = BookingInput.safeParse(c.input);
    const all = { ...(result.success ? {} : zodFieldErrors(result.error)), ...c.errors };
    if (!result.success || Object.keys(c.errors).length) {
      setErrors(all);
      setFormError('Check the highlighted fields.');
      focusFirstInvalid();
      return;
    }
    setErrors({});
    if (booking) {
      update.mutate({ id: booking.id, body: result.data }, { onSuccess: () => setSaved('Booking saved.'), onError: showServerError });
    } else {
      create.mutate(result.data, { onSuccess: (b) => onCreated?.(b), onError: showServerError });
    }
  };

  const addPlannerLines = (planned: PlannerLine[]) => {
    const byId = new Map(items.map((i) => [i.id, i]));
    let lines = [...state.lines];
    for (const p of planned) {
      const existing = lines.findIndex((l) => l.itemId === p.itemId);
      if (existing >= 0) lines = lines.map((l, i) => (i === existing ? { ...l, quantity: String(p.quantity) } : l));
      else {
        const item = byId.get(p.itemId);
        lines.push(item ? lineFromItem(item, p.quantity) : { ...lineFromItem({ id: p.itemId, name: p.name, rentalPriceCents: 0, extraDayPriceCents: 0, taxable: true, kind: 'accessory' } as ItemRow, p.quantity) });
      }
    }
    set({ lines });
    setNotice(`Added ${planned.length} lines from the planner. Check the quantities and prices, then save.`);
  };

  // The shortfall dialog's choices change the lines; the person saves and reserves again.
  const handled = (s: ShortfallDetail, message: string) => {
    setNotice(message);
    setShortfalls((prev) => {
      const rest = (prev ?? []).filter((x) => x.itemId !== s.itemId);
      return rest.length ? rest : null;
    });
  };
  const reduce = (s: ShortfallDetail) => {
    const index = state.lines.findIndex((l) => l.itemId === s.itemId);
    if (index < 0) return;
    const quantity = Math.max(0, (Number.parseInt(state.lines[index].quantity, 10) || 0) - s.shortfall);
    set({ lines: state.lines.map((l, i) => (i === index ? { ...l, quantity: String(quantity) } : l)) });
    handled(s, `${s.name} reduced to ${quantity} on line ${index + 1}. Save the booking, then reserve again.`);
  };
  const substitute = (s: ShortfallDetail) => {
    const index = state.lines.findIndex((l) => l.itemId === s.itemId);
    handled(s, `Choose another item on line ${index + 1} in place of ${s.name}, then save and reserve again.`);
    requestAnimationFrame(() => formRef.current?.querySelector<HTMLSelectElement>(`select[data-line-item="${index}"]`)?.focus());
  };
  const subRent = (s: ShortfallDetail) => {
    const index = state.lines.findIndex((l) => l.itemId === s.itemId);
    if (index < 0) return;
    const own = state.lines[index];
    const quantity = Math.max(0, (Number.parseInt(own.quantity, 10) || 0) - s.shortfall);
    const subLine = { ...own, key: newKey(), itemId: '', description: `${s.name}, sub-rented from another company`, quantity: String(s.shortfall) };
    const lines = state.lines.flatMap((l, i) => (i === index ? [{ ...l, quantity: String(quantity) }, subLine] : [l]));
    set({ lines });
    handled(s, `${s.shortfall} ${s.name} moved to a sub-rented line (line ${index + 2}); set its price to what you pay and charge, then save.`);
  };

  return (
    <>
      <form ref={formRef} onSubmit={submit} noValidate aria-label={booking ? `Booking ${booking.reference}` : 'New booking'} className="space-y-6">
        <LiveRegion>{saved ? <Alert tone="success">{saved}</Alert> : null}</LiveRegion>
        <FormMessage message={formError} />
        <LiveRegion>{notice ? <Alert tone="info">{notice}</Alert> : null}</LiveRegion>
        {readOnly && booking ? <Alert tone="info">This booking is {booking.status}; you can read it but not change it here.</Alert> : null}

        <SectionCard title="Customer">
          <CustomerPicker
            customerId={state.customerId}
            initial={booking?.customer ?? null}
            error={errors.customerId}
            readOnly={readOnly}
            onChange={(c) => {
              set({ customerId: c.id });
              setTaxExempt(c.taxExempt);
            }}
          />
        </SectionCard>

        <fieldset disabled={readOnly || saving} className="min-w-0 space-y-6">
          <SectionCard title="Event, delivery and pickup">
            <WindowFields state={state} errors={errors} set={set} timeZone={timeZone} />
          </SectionCard>
          <SectionCard title="Site">
            <SiteFields state={state} errors={errors} set={set} />
          </SectionCard>
          <SectionCard title="Guests">
            <GuestFields state={state} errors={errors} set={set} />
          </SectionCard>
          <SectionCard title="Lines" description="Pick items from the catalog (their list prices fill in), or type a free-text line or a fee.">
            {short.length ? (
              <Alert tone="danger" className="mb-3" title="Not enough stock for these dates">
                <ul>
                  {short.map(([id, a]) => (
                    <li key={id}>
                      {items.find((i) => i.id === id)?.name ?? state.lines.find((l) => l.itemId === id)?.description}: {a.available} free, short by {a.shortfall}
                    </li>
                  ))}
                </ul>
                Reduce the quantity, pick a substitute item, or sub-rent from another company.
              </Alert>
            ) : null}
            <LinesTable
              lines={state.lines}
              items={items}
              errors={errors}
              currency={currency}
              showPrices={seePrices}
              readOnly={readOnly}
              availability={availability}
              checking={live.isFetching}
              lineTotals={lineTotals}
              onChange={(lines) => set({ lines })}
            />
          </SectionCard>
          {seePrices ? (
            <SectionCard title="Charges">
              <ChargeFields state={state} errors={errors} set={set} companyTaxRate={bpToPercentInput(rules.taxRateBp)} />
            </SectionCard>
          ) : null}
          <SectionCard title="Notes">
            <TextArea label="Booking notes" hint="For the office and crew; not printed for the customer." {...{ value: state.notes, error: errors.notes, onChange: (e: React.ChangeEvent<HTMLTextAreaElement>) => set({ notes: e.target.value }) }} />
          </SectionCard>
        </fieldset>

        {readOnly ? null : (
          <div className="sticky bottom-0 z-10 -mx-4 flex flex-wrap items-center gap-3 border-t border-canvas-200 bg-white/95 px-4 py-3 sm:mx-0 sm:rounded-lg sm:border">
            <Button type="submit" isLoading={saving}>
              {saving ? 'Saving…' : booking ? 'Save booking' : 'Create booking'}
            </Button>
            {liveQuote ? (
              <span className="text-sm text-canvas-800">
                Total <span className="font-semibold tabular-nums">{formatMoney(liveQuote.totalCents, currency)}</span>
              </span>
            ) : null}
            {dirty ? <span className="text-sm text-ochre-800">Unsaved changes</span> : null}
          </div>
        )}
      </form>

      {booking && documents ? <div className="mt-6">{documents({ dirty })}</div> : null}

      <div className="mt-6 grid gap-6 lg:grid-cols-2">
        {seePrices ? (
          <SectionCard title="Quote" description="Live, as you type; the saved booking’s totals are the ones that count.">
            <QuotePanel result={liveQuote} currency={currency} taxExempt={taxExempt} saved={booking?.totals ?? null} />
          </SectionCard>
        ) : null}
        <SectionCard title="Tent planner" description="Size the tent and the order from the guest count and seating.">
          <PlannerPanel
            guests={Number.parseInt(state.guestCount, 10) || 0}
            seating={state.seating}
            afterDark={state.afterDark}
            openSided={openSided}
            onOpenSidedChange={setOpenSided}
            onAddLines={readOnly ? undefined : addPlannerLines}
          />
        </SectionCard>
        {booking ? (
          <SectionCard title="Status">
            <StatusActions booking={booking} dirty={dirty} onShortfall={setShortfalls} />
          </SectionCard>
        ) : null}
        {booking ? (
          <SectionCard title="History">
            <HistoryList bookingId={booking.id} timeZone={timeZone} />
          </SectionCard>
        ) : null}
      </div>

      <ShortfallDialog shortfalls={shortfalls} onClose={() => setShortfalls(null)} onReduce={reduce} onSubstitute={substitute} onSubRent={subRent} />
    </>
  );
}
