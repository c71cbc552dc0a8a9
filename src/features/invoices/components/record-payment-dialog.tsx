import { useMemo, useRef } from 'react';
import { addDays, dateInZone } from '@shared/dates';
import { formatMoney } from '@shared/money';
import { latestIssueDate, recordPaymentRequestFor, type InvoiceRow, type PaymentRow } from '@shared/schemas/invoices';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { Dialog } from '@/components/ui/dialog';
import { Select } from '@/components/ui/select';
import { TextField } from '@/components/ui/text-field';
import { collector, parseDollars } from '@/lib/amounts';
import { ApiError, errorMessage } from '@/lib/api';
import { useZodForm, type FieldErrors } from '@/lib/form';
import { formatCalendarDate, isoToZonedInput, zonedInputToIso } from '@/lib/zoned-time';
import { useRecordPayment } from '../api/record-payment';
import { invoiceNumber, offlineMethodOptions } from './invoice-labels';

type Values = Record<string, string>;

/** One invoice takes `amountCents` (the schema's own field); a split has one field per invoice. */
const SINGLE = 'amountCents';
/** "true" when an overpayment on one invoice is to be kept as the customer's credit. */
const KEEP = 'keepExcessAsCredit';
const amountKey = (invoice: Pick<InvoiceRow, 'id'>, split: boolean) => (split ? `amount_${invoice.id}` : SINGLE);

interface PaymentFormProps {
  /** The invoices the payment may go to: one from the invoice page, the booking's open ones from the booking. */
  invoices: readonly InvoiceRow[];
  split: boolean;
  timeZone: string;
  onDone: (payment: PaymentRow) => void;
  onCancel: () => void;
}

/** The typed strings as a RecordPaymentRequest, and the invoices in the order they were sent (to place the server's messages). */
function toRequest(v: Values, invoices: readonly InvoiceRow[], split: boolean, timeZone: string) {
  const c = collector();
  c.input.method = v.method || undefined;
  c.input.receivedAt = v.receivedAt ? (zonedInputToIso(v.receivedAt, timeZone) ?? v.receivedAt) : undefined;
  c.input.reference = v.reference;
  const parts: { invoiceId: string; amountCents: number }[] = [];
  // Only one invoice can take more than its balance, and only when the office says so.
  const keepExcess = !split && v[KEEP] === 'true';
  c.input.keepExcessAsCredit = false;
  for (const invoice of invoices) {
    const key = amountKey(invoice, split);
    const parsed = parseDollars(v[key] ?? '', null);
    if (!parsed.ok) c.errors[key] = parsed.message;
    else if (!parsed.value) {
      // In a split an empty field means "nothing on this invoice".
      if (!split) c.errors[key] = parsed.value === 0 ? 'The amount must be above zero.' : 'Enter the amount.';
    } else if (parsed.value > invoice.balanceCents && !keepExcess) {
      c.errors[key] = split
        ? `That is more than the balance of ${invoiceNumber(invoice)}, ${formatMoney(invoice.balanceCents, invoice.currency)}.`
        : `That is more than the balance of ${invoiceNumber(invoice)}, ${formatMoney(invoice.balanceCents, invoice.currency)}. Lower it, or keep the extra as the customer’s credit.`;
    } else {
      if (parsed.value > invoice.balanceCents) c.input.keepExcessAsCredit = true;
      parts.push({ invoiceId: invoice.id, amountCents: parsed.value });
    }
  }
  if (split && parts.length === 0 && Object.keys(c.errors).length === 0 && invoices[0]) {
    c.errors[amountKey(invoices[0], split)] = 'Enter an amount for at least one invoice.';
  }
  if (parts.length === 1) {
    c.input.invoiceId = parts[0].invoiceId;
    c.input.amountCents = parts[0].amountCents;
  } else if (parts.length > 1) c.input.allocations = parts;
  return { ...c, sent: parts.map((p) => p.invoiceId) };
}

/**
 * The server names fields by the request's paths ("allocations.1.amountCents", "amountCents");
 * the form names them by invoice. Unknown paths stay form-level.
 */
function placeServerFields(fields: Record<string, string>, sent: readonly string[], split: boolean): FieldErrors {
  const out: FieldErrors = {};
  const byId = (id: string | undefined) => (id ? (split ? `amount_${id}` : SINGLE) : null);
  for (const [path, message] of Object.entries(fields)) {
    const allocation = /^allocations\.(\d+)/.exec(path);
    const key =
      allocation ? byId(sent[Number(allocation[1])])
      : path === 'amountCents' || path === 'invoiceId' ? byId(sent[0])
      : sent.includes(path) ? byId(path)
      : ['method', 'receivedAt', 'reference'].includes(path) ? path
      : null;
    if (key && !(key in out)) out[key] = message;
  }
  return out;
}

function PaymentForm({ invoices, split, timeZone, onDone, onCancel, record }: PaymentFormProps & { record: ReturnType<typeof useRecordPayment> }) {
  const initial: Values = { method: '', receivedAt: isoToZonedInput(new Date().toISOString(), timeZone), reference: '', [KEEP]: '' };
  for (const invoice of invoices) initial[amountKey(invoice, split)] = '';
  const sent = useRef<string[]>([]);
  const today = dateInZone(new Date(), timeZone);
  // The request's schema with the received day's bounds (the invoices' issue day through tomorrow),
  // as the server checks them.
  const schema = useMemo(
    () => recordPaymentRequestFor({ issueDateOf: (id) => invoices.find((i) => i.id === id)?.issueDate, today, timeZone }),
    [invoices, today, timeZone],
  );
  const earliest = latestIssueDate(invoices.map((i) => i.issueDate));
  const form = useZodForm(schema, initial, {
    toInput: (v) => {
      const r = toRequest(v, invoices, split, timeZone);
      return { input: r.input, errors: r.errors };
    },
  });
  const currency = invoices[0]?.currency ?? 'USD';

  const showError = (error: unknown) => {
    form.setFormError(errorMessage(error));
    if (!(error instanceof ApiError)) return;
    const placed = placeServerFields(error.fields, sent.current, split);
    // An overpayment always belongs to an amount; without a field named, the first part sent.
    if (Object.keys(placed).length === 0 && error.code === 'overpayment' && sent.current[0]) placed[split ? `amount_${sent.current[0]}` : SINGLE] = error.message;
    if (Object.keys(placed).length === 0) return;
    form.setErrors(placed);
    requestAnimationFrame(() => form.formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
  };

  const submit = form.handleSubmit((body) => {
    sent.current = toRequest(form.values, invoices, split, timeZone).sent;
    form.setFormError(null);
    record.mutate(body, { onSuccess: onDone, onError: showError });
  });

  // On one invoice: what the typed amount is above the balance, if anything.
  const single = split ? null : parseDollars(form.values[SINGLE] ?? '', 0);
  const excessCents = single?.ok && single.value && invoices[0] && single.value > invoices[0].balanceCents ? single.value - invoices[0].balanceCents : 0;

  // What the split adds up to, from the fields that read as amounts.
  const total = invoices.reduce((sum, invoice) => {
    const parsed = parseDollars(form.values[amountKey(invoice, split)] ?? '', 0);
    return sum + (parsed.ok ? (parsed.value ?? 0) : 0);
  }, 0);

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label="Record a payment" className="space-y-4">
      <p className="text-sm text-canvas-700">Cash, a check or a bank transfer. A receipt is made as a PDF and e-mailed to the customer.</p>
      <FormMessage message={form.formError} />
      <fieldset disabled={record.isPending} className="space-y-4">
        <div className={split ? 'grid gap-4 sm:grid-cols-2' : 'space-y-4'}>
          <Select label="Method" options={offlineMethodOptions} placeholder="Choose how it was paid" required {...form.field('method')} />
          {split ? null : (
            <TextField
              label="Amount"
              inputMode="decimal"
              autoComplete="off"
              required
              hint={`In dollars and cents, like 125.00. The balance is ${formatMoney(invoices[0].balanceCents, currency)}.`}
              {...form.field(SINGLE)}
            />
          )}
          {excessCents > 0 ? (
            <Checkbox
              label={`Keep the extra ${formatMoney(excessCents, currency)} as the customer’s credit`}
              hint="The credit can pay any of their invoices later, or the owner can pay it back."
              checked={form.values[KEEP] === 'true'}
              onChange={(event) => {
                form.setValue(KEEP, event.target.checked ? 'true' : '');
                // The amount's "more than the balance" message no longer applies once ticked.
                if (event.target.checked) form.setValue(SINGLE, form.values[SINGLE] ?? '');
              }}
            />
          ) : null}
          <TextField
            label="Received at"
            type="datetime-local"
            required
            hint={`On your company’s clock (${timeZone.replaceAll('_', ' ')}), ${split || !earliest ? '' : `from the issue day, ${formatCalendarDate(earliest)}, `}through tomorrow, ${formatCalendarDate(addDays(today, 1))}.`}
            {...form.field('receivedAt')}
          />
          <TextField label="Reference" autoComplete="off" maxLength={80} hint="A check number or transfer reference; optional." {...form.field('reference')} />
        </div>
        {split ? (
          <fieldset className="space-y-3">
            <legend className="text-sm font-semibold text-canvas-800">How much goes to each invoice</legend>
            <p className="text-sm text-canvas-700">In dollars and cents. Leave an invoice empty to pay nothing on it.</p>
            <div className="grid gap-4 sm:grid-cols-2">
              {invoices.map((invoice) => (
                <TextField
                  key={invoice.id}
                  label={`Amount for ${invoiceNumber(invoice)}`}
                  inputMode="decimal"
                  autoComplete="off"
                  hint={`Balance ${formatMoney(invoice.balanceCents, invoice.currency)}${invoice.overdue ? ', overdue' : ''}.`}
                  {...form.field(amountKey(invoice, split))}
                />
              ))}
            </div>
            <p className="text-sm text-canvas-800" aria-live="polite">
              Payment total: <span className="font-semibold tabular-nums">{formatMoney(total, currency)}</span>
            </p>
          </fieldset>
        ) : null}
      </fieldset>
      <div className="flex flex-wrap justify-end gap-2 pt-2">
        <Button variant="secondary" onClick={onCancel} disabled={record.isPending}>
          Cancel
        </Button>
        <Button type="submit" isLoading={record.isPending}>
          Record payment
        </Button>
      </div>
    </form>
  );
}

interface RecordPaymentDialogProps extends PaymentFormProps {
  open: boolean;
}

/** The h2 "Record a payment" dialog; its form starts afresh each time it opens. */
export function RecordPaymentDialog({ open, onCancel, ...rest }: RecordPaymentDialogProps) {
  const record = useRecordPayment();
  const close = () => {
    record.reset();
    onCancel();
  };
  return (
    <Dialog open={open} wide={rest.split} title="Record a payment" busy={record.isPending} onClose={close}>
      <PaymentForm {...rest} record={record} onCancel={close} />
    </Dialog>
  );
}
