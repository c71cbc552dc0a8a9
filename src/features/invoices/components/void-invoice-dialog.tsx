import { VoidInvoiceRequest, type InvoiceRow } from '@shared/schemas/invoices';
import { Alert, FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { TextArea } from '@/components/ui/textarea';
import { isApiError } from '@/lib/api';
import { useZodForm } from '@/lib/form';
import { useVoidInvoice } from '../api/void-invoice';
import { invoiceName } from './invoice-labels';

/** "invoice INV-2027-0004", or "the draft deposit invoice" before it has a number. */
const which = (i: InvoiceRow) => (i.number ? `invoice ${i.number}` : `the ${invoiceName(i).toLowerCase()}`);

function VoidForm({ invoice, onDone, onCancel, voiding }: { invoice: InvoiceRow; onDone: (invoice: InvoiceRow) => void; onCancel: () => void; voiding: ReturnType<typeof useVoidInvoice> }) {
  const form = useZodForm(VoidInvoiceRequest, { reason: '' });
  const submit = form.handleSubmit((body) => {
    form.setFormError(null);
    voiding.mutate({ id: invoice.id, body }, { onSuccess: onDone, onError: form.showError });
  });
  const hasPayments = isApiError(voiding.error, 'has_payments');

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label={`Void ${which(invoice)}`} className="space-y-4">
      <p className="text-sm text-canvas-700">
        {invoice.number
          ? 'The invoice keeps its number and stays in the list, marked void. A ledger entry reverses what it posted, so the booking’s balance no longer counts it.'
          : 'The draft stays in the list, marked void. It was never posted, so no balance changes.'}
      </p>
      {hasPayments ? (
        <Alert tone="danger" title="Money was received on this invoice.">
          {voiding.error?.message} A paid invoice is corrected with a credit note instead.
        </Alert>
      ) : (
        <FormMessage message={form.formError} />
      )}
      <TextArea label="Reason" required maxLength={500} hint="Kept with the invoice and on the reversing entry." disabled={voiding.isPending} {...form.field('reason')} />
      <div className="flex flex-wrap justify-end gap-2 pt-2">
        <Button variant="secondary" onClick={onCancel} disabled={voiding.isPending}>
          Keep the invoice
        </Button>
        <Button type="submit" variant="danger" isLoading={voiding.isPending} disabled={hasPayments}>
          Void the invoice
        </Button>
      </div>
    </form>
  );
}

/** Owner only (the invoice's can.void): asks why, then voids. */
export function VoidInvoiceDialog({ open, invoice, onDone, onCancel }: { open: boolean; invoice: InvoiceRow; onDone: (invoice: InvoiceRow) => void; onCancel: () => void }) {
  const voiding = useVoidInvoice();
  const close = () => {
    voiding.reset();
    onCancel();
  };
  return (
    <Dialog open={open} title={`Void ${which(invoice)}?`} busy={voiding.isPending} onClose={close}>
      <VoidForm invoice={invoice} voiding={voiding} onDone={onDone} onCancel={close} />
    </Dialog>
  );
}
