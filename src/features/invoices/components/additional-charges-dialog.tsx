import { useRef, useState, type FormEvent } from 'react';
import { formatMoney, sum } from '@shared/money';
import {
  ADDITIONAL_CHARGE_LABELS,
  ADDITIONAL_CHARGE_TAXABLE,
  ADDITIONAL_CHARGES,
  CreateInvoiceRequest,
  type AdditionalCharge,
  type InvoiceRow,
} from '@shared/schemas/invoices';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { Dialog } from '@/components/ui/dialog';
import { Select } from '@/components/ui/select';
import { TextField } from '@/components/ui/text-field';
import { parseDollars } from '@/lib/amounts';
import { ApiError, errorMessage } from '@/lib/api';
import { zodFieldErrors, type FieldErrors } from '@/lib/form';
import { useCreateBookingInvoice } from '../api/create-booking-invoice';

/** The schema's own limit on lines. */
const MAX_LINES = 50;

interface Line {
  /** Stable across removals, so React keeps each row's inputs with its row. */
  key: number;
  charge: AdditionalCharge;
  description: string;
  amount: string;
  taxable: boolean;
  /** Once the office sets "taxable" itself, changing the charge no longer resets it to the default. */
  taxableSet: boolean;
}

const chargeOptions = ADDITIONAL_CHARGES.map((value) => ({ value, label: ADDITIONAL_CHARGE_LABELS[value] }));

const newLine = (key: number, charge: AdditionalCharge = 'damage'): Line => ({ key, charge, description: '', amount: '', taxable: ADDITIONAL_CHARGE_TAXABLE[charge], taxableSet: false });

/** Errors are keyed by the request's own paths ("lines.1.amountCents"), as the server names them. */
const path = (index: number, field: 'charge' | 'description' | 'amountCents' | 'taxable') => `lines.${index}.${field}`;

/** After a row is removed, the messages of the rows below it move up with them. */
function shiftErrors(errors: FieldErrors, removed: number): FieldErrors {
  const out: FieldErrors = {};
  for (const [key, message] of Object.entries(errors)) {
    const m = /^lines\.(\d+)\.(.+)$/.exec(key);
    if (!m) out[key] = message;
    else if (Number(m[1]) < removed) out[key] = message;
    else if (Number(m[1]) > removed) out[`lines.${Number(m[1]) - 1}.${m[2]}`] = message;
  }
  return out;
}

/** The rows as a CreateInvoiceRequest, and the messages for amounts that could not be read. */
function toRequest(lines: readonly Line[]) {
  const unreadable: FieldErrors = {};
  const body = {
    kind: 'additional' as const,
    lines: lines.map((line, index) => {
      const parsed = parseDollars(line.amount, null);
      if (!parsed.ok) unreadable[path(index, 'amountCents')] = parsed.message;
      return { charge: line.charge, description: line.description, amountCents: parsed.ok ? (parsed.value ?? undefined) : undefined, taxable: line.taxable };
    }),
  };
  return { body, unreadable };
}

interface ChargesFormProps {
  bookingId: string;
  currency: string;
  onDone: (invoice: InvoiceRow) => void;
  onCancel: () => void;
  creating: ReturnType<typeof useCreateBookingInvoice>;
}

function ChargesForm({ bookingId, currency, onDone, onCancel, creating }: ChargesFormProps) {
  const nextKey = useRef(1);
  const [lines, setLines] = useState<Line[]>(() => [newLine(0)]);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const money = (cents: number) => formatMoney(cents, currency);

  const focusFirstInvalid = () => requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());

  const update = (index: number, patch: Partial<Line>, field: Parameters<typeof path>[1]) => {
    setLines((prev) => prev.map((line, i) => (i === index ? { ...line, ...patch } : line)));
    setErrors((prev) => {
      if (!(path(index, field) in prev)) return prev;
      const next = { ...prev };
      delete next[path(index, field)];
      return next;
    });
  };

  const add = () => {
    const key = nextKey.current++;
    const index = lines.length;
    setLines((prev) => [...prev, newLine(key)]);
    // The new row's first field, so typing goes on from the keyboard.
    requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>(`[data-line="${index}"] select`)?.focus());
  };

  const remove = (index: number) => {
    setLines((prev) => prev.filter((_, i) => i !== index));
    setErrors((prev) => shiftErrors(prev, index));
    requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>('[data-add-charge]')?.focus());
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const { body, unreadable } = toRequest(lines);
    const parsed = CreateInvoiceRequest.safeParse(body);
    if (!parsed.success || Object.keys(unreadable).length > 0) {
      const found = { ...(parsed.success ? {} : zodFieldErrors(parsed.error)), ...unreadable };
      setErrors(found);
      setFormError(found.lines ?? 'Check the highlighted fields.');
      focusFirstInvalid();
      return;
    }
    setErrors({});
    setFormError(null);
    creating.mutate(
      { bookingId, body: parsed.data },
      {
        onSuccess: onDone,
        onError: (error) => {
          setFormError(errorMessage(error));
          if (error instanceof ApiError && Object.keys(error.fields).length > 0) {
            setErrors(error.fields);
            focusFirstInvalid();
          }
        },
      },
    );
  };

  // The running sums, from the amounts that read as money.
  const amounts = lines.map((line) => {
    const parsed = parseDollars(line.amount, 0);
    return parsed.ok ? (parsed.value ?? 0) : 0;
  });
  const subtotal = sum(amounts);
  const taxablePart = sum(amounts.filter((_, i) => lines[i].taxable));

  return (
    <form ref={formRef} onSubmit={submit} noValidate aria-label="Additional charges" className="space-y-4">
      <p className="text-sm text-canvas-700">
        Bill what came up after the event: repairs, missing stock, a late return or cleaning. The invoice is made as a draft; check it, then issue it like any other.
      </p>
      <FormMessage message={formError} />
      <fieldset disabled={creating.isPending} className="space-y-4">
        {lines.map((line, index) => {
          const n = index + 1;
          return (
            <fieldset key={line.key} data-line={index} className="rounded-md border border-canvas-200 p-3">
              <legend className="px-1 text-sm font-semibold text-canvas-800">Charge {n}</legend>
              <div className="grid gap-3 sm:grid-cols-[minmax(0,12rem)_minmax(0,1fr)_minmax(0,8rem)]">
                <Select
                  label="Type"
                  options={chargeOptions}
                  required
                  value={line.charge}
                  error={errors[path(index, 'charge')]}
                  onChange={(event) => {
                    const charge = event.target.value as AdditionalCharge;
                    update(index, line.taxableSet ? { charge } : { charge, taxable: ADDITIONAL_CHARGE_TAXABLE[charge] }, 'charge');
                  }}
                />
                <TextField
                  label="Description"
                  autoComplete="off"
                  required
                  maxLength={200}
                  value={line.description}
                  error={errors[path(index, 'description')]}
                  onChange={(event) => update(index, { description: event.target.value }, 'description')}
                />
                <TextField
                  label="Amount"
                  inputMode="decimal"
                  autoComplete="off"
                  required
                  value={line.amount}
                  error={errors[path(index, 'amountCents')]}
                  onChange={(event) => update(index, { amount: event.target.value }, 'amountCents')}
                />
              </div>
              <div className="mt-3 flex flex-wrap items-start justify-between gap-2">
                <Checkbox
                  label="Taxable"
                  hint={`${ADDITIONAL_CHARGE_LABELS[line.charge]} is ${ADDITIONAL_CHARGE_TAXABLE[line.charge] ? '' : 'not '}taxed unless you say otherwise; your state’s rules decide.`}
                  checked={line.taxable}
                  error={errors[path(index, 'taxable')]}
                  onChange={(event) => update(index, { taxable: event.target.checked, taxableSet: true }, 'taxable')}
                />
                {lines.length > 1 ? (
                  <Button size="sm" variant="ghost" onClick={() => remove(index)}>
                    Remove<span className="sr-only"> charge {n}</span>
                  </Button>
                ) : null}
              </div>
            </fieldset>
          );
        })}
        {lines.length < MAX_LINES ? (
          <Button data-add-charge size="sm" variant="secondary" onClick={add}>
            Add a charge
          </Button>
        ) : (
          <p className="text-sm text-canvas-700">That is the most one invoice can carry ({MAX_LINES} charges).</p>
        )}
      </fieldset>
      <div className="rounded-md border border-canvas-200 bg-canvas-50 px-3 py-2 text-sm text-canvas-800" aria-live="polite">
        <p>
          Charges: <span className="font-semibold tabular-nums">{money(subtotal)}</span>
          {taxablePart > 0 ? (
            <>
              , of which <span className="tabular-nums">{money(taxablePart)}</span> taxable
            </>
          ) : null}
          .
        </p>
        <p className="mt-1 text-canvas-700">Sales tax on the taxable charges is added at the booking’s rate when the draft is made; a tax-exempt customer pays none.</p>
      </div>
      <div className="flex flex-wrap justify-end gap-2 pt-2">
        <Button variant="secondary" onClick={onCancel} disabled={creating.isPending}>
          Cancel
        </Button>
        <Button type="submit" isLoading={creating.isPending}>
          Create the draft invoice
        </Button>
      </div>
    </form>
  );
}

interface AdditionalChargesDialogProps {
  open: boolean;
  bookingId: string;
  currency: string;
  onDone: (invoice: InvoiceRow) => void;
  onCancel: () => void;
}

/** The h2 "Additional charges" dialog: rows of charges that become a draft invoice; it starts afresh each time it opens. */
export function AdditionalChargesDialog({ open, onCancel, ...rest }: AdditionalChargesDialogProps) {
  const creating = useCreateBookingInvoice();
  const close = () => {
    creating.reset();
    onCancel();
  };
  return (
    <Dialog open={open} wide title="Additional charges" busy={creating.isPending} onClose={close}>
      <ChargesForm {...rest} creating={creating} onCancel={close} />
    </Dialog>
  );
}
