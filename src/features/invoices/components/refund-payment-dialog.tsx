import { formatMoney } from '@shared/money';
import { RefundRequest, type PaymentRow } from '@shared/schemas/invoices';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { TextArea } from '@/components/ui/textarea';
import { TextField } from '@/components/ui/text-field';
import { collector, parseDollars } from '@/lib/amounts';
import { useZodForm } from '@/lib/form';
import { formatZoned } from '@/lib/zoned-time';
import { useRefundPayment, type RefundRow } from '../api/refund-payment';
import { PAYMENT_METHOD_LABELS } from './invoice-labels';

interface RefundFormProps {
  payment: PaymentRow;
  currency: string;
  timeZone: string;
  /** What is left to refund of this payment, when the ledger can tell; null when it cannot. */
  refundableCents: number | null;
  onDone: (refund: RefundRow) => void;
  onCancel: () => void;
}

function toInput(v: Record<string, string>) {
  const c = collector();
  c.put('amountCents', parseDollars(v.amountCents, null));
  c.input.reason = v.reason;
  return c;
}

function RefundForm({ payment, currency, timeZone, refundableCents, onDone, onCancel, refunding }: RefundFormProps & { refunding: ReturnType<typeof useRefundPayment> }) {
  const form = useZodForm(RefundRequest, { amountCents: '', reason: '' }, { toInput });
  const money = (cents: number) => formatMoney(cents, currency);
  const submit = form.handleSubmit((body) => {
    if (refundableCents !== null && body.amountCents > refundableCents) {
      form.setErrors({ amountCents: `At most ${money(refundableCents)}.` });
      form.setFormError('Check the highlighted fields.');
      requestAnimationFrame(() => form.formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
      return;
    }
    form.setFormError(null);
    refunding.mutate({ paymentId: payment.id, body }, { onSuccess: onDone, onError: form.showError });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label="Refund a payment" className="space-y-4">
      <p className="text-sm text-canvas-700">
        {PAYMENT_METHOD_LABELS[payment.method] ?? payment.method} of {money(payment.amountCents)}, received {formatZoned(payment.receivedAt, timeZone)}.{' '}
        {payment.method === 'card'
          ? 'The money goes back to the same card through the card processor; the invoices it paid are owed again once the processor confirms the refund.'
          : 'Give the money back the same way; the invoices it paid are owed again by what you refund.'}
      </p>
      <FormMessage message={form.formError} />
      <fieldset disabled={refunding.isPending} className="space-y-4">
        <TextField
          label="Amount to refund"
          inputMode="decimal"
          autoComplete="off"
          required
          hint={
            refundableCents === null
              ? `In dollars and cents, like 125.00. At most the payment’s ${money(payment.amountCents)}, less anything refunded from it before.`
              : `In dollars and cents, like 125.00. ${money(refundableCents)} of this payment can still be refunded.`
          }
          {...form.field('amountCents')}
        />
        <TextArea label="Reason" required maxLength={500} hint="Kept with the refund and on its ledger entry." {...form.field('reason')} />
      </fieldset>
      <div className="flex flex-wrap justify-end gap-2 pt-2">
        <Button variant="secondary" onClick={onCancel} disabled={refunding.isPending}>
          Cancel
        </Button>
        <Button type="submit" variant="danger" isLoading={refunding.isPending}>
          Refund
        </Button>
      </div>
    </form>
  );
}

/** Owner only: the h2 "Refund a payment" dialog; its form starts afresh each time it opens. */
export function RefundPaymentDialog({ payment, onCancel, ...rest }: Omit<RefundFormProps, 'payment'> & { payment: PaymentRow | null }) {
  const refunding = useRefundPayment();
  const close = () => {
    refunding.reset();
    onCancel();
  };
  return (
    <Dialog open={payment !== null} title="Refund a payment" busy={refunding.isPending} onClose={close}>
      {payment ? <RefundForm key={payment.id} payment={payment} refunding={refunding} onCancel={close} {...rest} /> : null}
    </Dialog>
  );
}
