import { useId, useState } from 'react';
import { formatMoney, subtract } from '@shared/money';
import { SecurityDepositRequest } from '@shared/schemas/invoices';
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
import { PAYMENT_METHOD_LABELS } from './invoice-labels';

type Action = 'collect' | 'refund' | 'keep';

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
};

const methodOptions = (Object.keys(PAYMENT_METHOD_LABELS) as (keyof typeof PAYMENT_METHOD_LABELS)[]).map((value) => ({ value, label: PAYMENT_METHOD_LABELS[value] }));

interface MoveFormProps {
  bookingId: string;
  action: Action;
  initialCents: number;
  heldCents: number;
  currency: string;
  onDone: (move: SecurityDepositMoveRow) => void;
  onCancel: () => void;
  moving: ReturnType<typeof useMoveSecurityDeposit>;
}

function MoveForm({ bookingId, action, initialCents, heldCents, currency, onDone, onCancel, moving }: MoveFormProps) {
  const form = useZodForm(SecurityDepositRequest, { amountCents: initialCents > 0 ? centsToInput(initialCents) : '', method: '', reason: '' }, {
    toInput: (v) => {
      const c = collector();
      c.input.action = action;
      c.put('amountCents', parseDollars(v.amountCents, null));
      c.input.method = action === 'keep' ? undefined : v.method || undefined;
      c.input.reason = v.reason;
      return c;
    },
  });
  const money = (cents: number) => formatMoney(cents, currency);
  const submit = form.handleSubmit((body) => {
    form.setFormError(null);
    moving.mutate({ bookingId, body }, { onSuccess: onDone, onError: form.showError });
  });
  const a = ACTIONS[action];

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label={a.title} className="space-y-4">
      <p className="text-sm text-canvas-700">{a.intro}</p>
      <FormMessage message={form.formError} />
      <fieldset disabled={moving.isPending} className="space-y-4">
        <TextField
          label="Amount"
          inputMode="decimal"
          autoComplete="off"
          required
          hint={action === 'collect' ? 'In dollars and cents, like 250.00.' : `In dollars and cents, like 250.00. ${money(heldCents)} is held.`}
          {...form.field('amountCents')}
        />
        {action === 'keep' ? (
          <TextArea label="What the damage was" required maxLength={500} hint="Kept on the ledger entry, so the customer can be told what the money paid for." {...form.field('reason')} />
        ) : (
          <Select
            label="Method"
            options={methodOptions}
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
  /** Owner and office collect and keep. */
  canMove: boolean;
  /** Only the owner gives money back. */
  canReturn: boolean;
  onChanged?: () => void;
}

/** The refundable security deposit: agreed, held now, and the three moves, each a small dialog. */
export function SecurityDepositSection({ bookingId, agreedCents, heldCents, ledgerError, currency, canMove, canReturn, onChanged }: SecurityDepositSectionProps) {
  const ids = useId();
  const moving = useMoveSecurityDeposit();
  const [action, setAction] = useState<Action | null>(null);
  const [done, setDone] = useState<{ action: Action; move: SecurityDepositMoveRow } | null>(null);
  const money = (cents: number) => formatMoney(cents, currency);
  const held = heldCents ?? 0;
  const initial = action === 'collect' ? Math.max(0, subtract(agreedCents, held)) : action === 'refund' ? held : 0;

  const start = (next: Action) => {
    setDone(null);
    moving.reset();
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
          <dd className="text-lg font-semibold text-canvas-900 tabular-nums">
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
        </div>
      ) : null}
      <div className="mt-3">
        <LiveRegion>
          {done ? (
            <Alert tone="success">
              {money(done.move.amountCents)} of security deposit {ACTIONS[done.action].done}. {money(done.move.heldCents)} is held now.
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
            moving={moving}
            onCancel={close}
            onDone={(move) => {
              setDone({ action, move });
              setAction(null);
              onChanged?.();
            }}
          />
        ) : null}
      </Dialog>
    </section>
  );
}
