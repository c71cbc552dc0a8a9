import { useId, useState } from 'react';
import { formatMoney, subtract } from '@shared/money';
import { INVOICE_KIND_LABELS, SecurityDepositRequest, type InvoiceRow } from '@shared/schemas/invoices';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { Select } from '@/components/ui/select';
import { Spinner } from '@/components/ui/spinner';
import { TextArea } from '@/components/ui/textarea';
import { TextField } from '@/components/ui/text-field';
import { centsToInput, collector, parseDollars } from '@/lib/amounts';
import { useZodForm } from '@/lib/form';
import { useMoveSecurityDeposit, type SecurityDepositMoveRow } from '../api/move-security-deposit';
import { invoiceName, invoiceNumber, moneyMethodOptions } from './invoice-labels';

type Action = 'collect' | 'refund' | 'keep' | 'apply';

const ACTIONS: Record<Action, { title: string; submit: string; intro: string; done: string }> = {
  collect: {
    title: 'Collect the security deposit',
    submit: 'Record it as held',
    intro: 'Money the customer leaves with you until the equipment is back. It stays theirs while you hold it, so it is never revenue.',
    done: 'received and held',
  },
  refund: {
    title: 'Return the security deposit',
    submit: 'Record the return',
    intro: 'Give back what is held once the equipment is back and checked.',
    done: 'returned to the customer',
  },
  keep: {
    title: 'Keep part for damage',
    submit: 'Keep it for damage',
    intro: 'The part you keep becomes damage recovery income. Return the rest separately.',
    done: 'kept for damage',
  },
  apply: {
    title: 'Apply to an invoice',
    submit: 'Pay the invoice from the deposit',
    intro: 'Pays one of the booking’s invoices, such as additional charges for damage, with money the deposit holds. It shows on the invoice as a payment from the security deposit; the rest stays held.',
    done: 'applied',
  },
};

/** The most of the deposit that can go to an invoice: what is held, and no more than its balance. */
const applicable = (heldCents: number, invoice: InvoiceRow | undefined) => (invoice ? Math.max(0, Math.min(heldCents, invoice.balanceCents)) : 0);

interface MoveFormProps {
  bookingId: string;
  action: Action;
  initialCents: number;
  heldCents: number;
  currency: string;
  /** The booking's invoices that still have a balance, for `apply`. */
  invoices: readonly InvoiceRow[];
  onDone: (move: SecurityDepositMoveRow, invoice: InvoiceRow | undefined) => void;
  onCancel: () => void;
  moving: ReturnType<typeof useMoveSecurityDeposit>;
}

function MoveForm({ bookingId, action, initialCents, heldCents, currency, invoices, onDone, onCancel, moving }: MoveFormProps) {
  // With a single open invoice there is nothing to choose.
  const firstInvoice = action === 'apply' && invoices.length === 1 ? invoices[0] : undefined;
  const startCents = action === 'apply' ? applicable(heldCents, firstInvoice) : initialCents;
  const form = useZodForm(
    SecurityDepositRequest,
    { amountCents: startCents > 0 ? centsToInput(startCents) : '', method: '', reason: '', invoiceId: firstInvoice?.id ?? '' },
    {
      toInput: (v) => {
        const c = collector();
        c.input.action = action;
        c.put('amountCents', parseDollars(v.amountCents, null));
        c.input.method = action === 'keep' || action === 'apply' ? undefined : v.method || undefined;
        if (action === 'apply') c.input.invoiceId = v.invoiceId || undefined;
        c.input.reason = v.reason;
        return c;
      },
    },
  );
  const money = (cents: number) => formatMoney(cents, currency);
  const chosen = invoices.find((i) => i.id === form.values.invoiceId);
  const submit = form.handleSubmit((body) => {
    if (action === 'apply' && chosen && body.amountCents > applicable(heldCents, chosen)) {
      // The server refuses it too; saying so here keeps the typed amount and names the limit.
      const most = applicable(heldCents, chosen);
      form.setErrors({ amountCents: `At most ${money(most)}: ${most === heldCents ? 'that is all the deposit holds' : `the balance of ${invoiceName(chosen)}`}.` });
      form.setFormError('Check the highlighted fields.');
      requestAnimationFrame(() => form.formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
      return;
    }
    form.setFormError(null);
    moving.mutate({ bookingId, body }, { onSuccess: (move) => onDone(move, chosen), onError: form.showError });
  });
  const a = ACTIONS[action];
  const invoiceField = form.field('invoiceId');

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label={a.title} className="space-y-4">
      <p className="text-sm text-canvas-700">{a.intro}</p>
      <FormMessage message={form.formError} />
      <fieldset disabled={moving.isPending} className="space-y-4">
        {action === 'apply' ? (
          <Select
            label="Invoice"
            // The number and what is owed first: a long option is cut at the end.
            options={invoices.map((i) => ({ value: i.id, label: `${invoiceNumber(i)}: ${money(i.balanceCents)} owed, ${INVOICE_KIND_LABELS[i.kind].toLowerCase()}` }))}
            placeholder={invoices.length === 1 ? undefined : 'Choose the invoice to pay'}
            required
            {...invoiceField}
            onChange={(event) => {
              invoiceField.onChange(event);
              // Prefill what can go to the invoice chosen: the held deposit, up to its balance.
              const most = applicable(heldCents, invoices.find((i) => i.id === event.target.value));
              form.setValue('amountCents', most > 0 ? centsToInput(most) : '');
            }}
          />
        ) : null}
        <TextField
          label="Amount"
          inputMode="decimal"
          autoComplete="off"
          required
          hint={
            action === 'collect'
              ? 'In dollars and cents, like 250.00.'
              : action === 'apply' && chosen
                ? `In dollars and cents, like 250.00. ${money(heldCents)} is held; the invoice’s balance is ${money(chosen.balanceCents)}.`
                : `In dollars and cents, like 250.00. ${money(heldCents)} is held.`
          }
          {...form.field('amountCents')}
        />
        {action === 'keep' ? (
          <TextArea label="What the damage was" required maxLength={500} hint="Kept on the ledger entry, so the customer can be told what the money paid for." {...form.field('reason')} />
        ) : action === 'apply' ? null : (
          <Select
            label="Method"
            options={moneyMethodOptions}
            placeholder={action === 'collect' ? 'Choose how it was paid' : 'Choose how it goes back'}
            required
            {...form.field('method')}
          />
        )}
      </fieldset>
      <div className="flex flex-wrap justify-end gap-2 pt-2">
        <Button variant="secondary" onClick={onCancel} disabled={moving.isPending}>
          Cancel
        </Button>
        <Button type="submit" isLoading={moving.isPending}>
          {a.submit}
        </Button>
      </div>
    </form>
  );
}

interface SecurityDepositSectionProps {
  bookingId: string;
  /** The booking's agreed security deposit (BookingRow.securityDepositCents). */
  agreedCents: number;
  /** Held now, from the ledger; undefined while it loads. */
  heldCents: number | undefined;
  ledgerError?: boolean;
  currency: string;
  /** The booking's issued invoices that can still take a payment (their own can.recordPayment). */
  openInvoices: readonly InvoiceRow[];
  /** Owner and office collect, keep and apply. */
  canMove: boolean;
  /** Only the owner gives money back. */
  canReturn: boolean;
  onChanged?: () => void;
}

/** The refundable security deposit: agreed, held now, and the moves, each a small dialog. */
export function SecurityDepositSection({ bookingId, agreedCents, heldCents, ledgerError, currency, openInvoices, canMove, canReturn, onChanged }: SecurityDepositSectionProps) {
  const ids = useId();
  const moving = useMoveSecurityDeposit();
  const [action, setAction] = useState<Action | null>(null);
  // The open invoices as they stood when the dialog opened, so a refetch does not reshape its fields.
  const [invoices, setInvoices] = useState<readonly InvoiceRow[]>([]);
  const [done, setDone] = useState<{ action: Action; move: SecurityDepositMoveRow; invoice?: InvoiceRow } | null>(null);
  const money = (cents: number) => formatMoney(cents, currency);
  const held = heldCents ?? 0;
  const initial = action === 'collect' ? Math.max(0, subtract(agreedCents, held)) : action === 'refund' ? held : 0;

  const start = (next: Action) => {
    setDone(null);
    moving.reset();
    setInvoices(openInvoices);
    setAction(next);
  };
  const close = () => {
    moving.reset();
    setAction(null);
  };

  return (
    <section aria-labelledby={`${ids}-heading`}>
      <h3 id={`${ids}-heading`} className="font-semibold text-canvas-900">
        Security deposit
      </h3>
      <p className="mt-1 text-sm text-canvas-700">Refundable; held apart from the booking’s invoices and never taxed.</p>
      <dl className="mt-2 grid grid-cols-2 gap-3 sm:max-w-md">
        <div className="rounded-md border border-canvas-200 bg-canvas-50 px-3 py-2">
          <dt className="text-sm text-canvas-700">Agreed</dt>
          <dd className="text-lg font-semibold text-canvas-900 tabular-nums">{money(agreedCents)}</dd>
        </div>
        <div className="rounded-md border border-canvas-200 bg-canvas-50 px-3 py-2">
          <dt className="text-sm text-canvas-700">Held now</dt>
          <dd className="text-lg font-semibold text-canvas-900 tabular-nums" data-testid="security-deposit-held">
            {heldCents !== undefined ? money(heldCents) : ledgerError ? '—' : <Spinner className="text-sm text-canvas-600" label="Loading…" />}
          </dd>
        </div>
      </dl>
      {canMove && heldCents !== undefined ? (
        <div className="mt-3 flex flex-wrap gap-2">
          <Button size="sm" variant="secondary" onClick={() => start('collect')}>
            Collect the security deposit
          </Button>
          {canReturn && held > 0 ? (
            <Button size="sm" variant="secondary" onClick={() => start('refund')}>
              Return the security deposit
            </Button>
          ) : null}
          {held > 0 ? (
            <Button size="sm" variant="secondary" onClick={() => start('keep')}>
              Keep part for damage
            </Button>
          ) : null}
          {held > 0 && openInvoices.length > 0 ? (
            <Button size="sm" variant="secondary" onClick={() => start('apply')}>
              Apply to an invoice
            </Button>
          ) : null}
        </div>
      ) : null}
      <div className="mt-3">
        <LiveRegion>
          {done ? (
            <Alert tone="success">
              {money(done.move.amountCents)} of security deposit {ACTIONS[done.action].done}
              {done.action === 'apply' && done.invoice ? ` to ${invoiceName(done.invoice)}` : ''}. {money(done.move.heldCents)} is held now.
            </Alert>
          ) : null}
        </LiveRegion>
      </div>
      <Dialog open={action !== null} title={action ? ACTIONS[action].title : ''} busy={moving.isPending} onClose={close}>
        {action ? (
          <MoveForm
            key={action}
            bookingId={bookingId}
            action={action}
            initialCents={initial}
            heldCents={held}
            currency={currency}
            invoices={invoices}
            moving={moving}
            onCancel={close}
            onDone={(move, invoice) => {
              setDone({ action, move, invoice });
              setAction(null);
              onChanged?.();
            }}
          />
        ) : null}
      </Dialog>
    </section>
  );
}
