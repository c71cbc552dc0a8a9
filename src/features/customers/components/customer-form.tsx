import { useState } from 'react';
import { CUSTOMER_TYPES, CustomerInput, type CustomerRow } from '@shared/schemas/customers';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { Select } from '@/components/ui/select';
import { TextArea } from '@/components/ui/textarea';
import { TextField } from '@/components/ui/text-field';
import { useZodForm } from '@/lib/form';
import { useCreateCustomer } from '../api/create-customer';
import { useUpdateCustomer } from '../api/update-customer';

const FIELDS = [
  'type',
  'name',
  'contactName',
  'email',
  'phone',
  'billingLine1',
  'billingLine2',
  'billingCity',
  'billingRegion',
  'billingPostalCode',
  'notes',
  'taxExempt',
] as const;
type FormValues = Record<(typeof FIELDS)[number], string>;

export const EMPTY_CUSTOMER: FormValues = {
  type: 'person',
  name: '',
  contactName: '',
  email: '',
  phone: '',
  billingLine1: '',
  billingLine2: '',
  billingCity: '',
  billingRegion: '',
  billingPostalCode: '',
  notes: '',
  taxExempt: 'false',
};

function toValues(c: CustomerRow): FormValues {
  return { ...(Object.fromEntries(FIELDS.map((k) => [k, String(c[k] ?? '')])) as FormValues), taxExempt: String(c.taxExempt) };
}

const typeOptions = CUSTOMER_TYPES.map((t) => ({ value: t, label: t === 'person' ? 'A person' : 'An organization' }));

interface CustomerFormProps {
  customer: CustomerRow | null;
  readOnly?: boolean;
  /** Fewer fields, for adding a customer from inside a booking. */
  compact?: boolean;
  onSaved?: (customer: CustomerRow) => void;
  onCancel?: () => void;
}

export function CustomerForm({ customer, readOnly = false, compact = false, onSaved, onCancel }: CustomerFormProps) {
  const form = useZodForm(CustomerInput, customer ? toValues(customer) : EMPTY_CUSTOMER, {
    toInput: (v) => ({ input: { ...v, taxExempt: v.taxExempt === 'true' } }),
  });
  const create = useCreateCustomer();
  const update = useUpdateCustomer();
  const saving = create.isPending || update.isPending;
  const [saved, setSaved] = useState(false);

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    setSaved(false);
    const options = {
      onSuccess: (next: CustomerRow) => {
        form.reset(toValues(next));
        setSaved(true);
        onSaved?.(next);
      },
      onError: form.showError,
    };
    if (customer) update.mutate({ id: customer.id, body: data }, options);
    else create.mutate(data, options);
  });

  return (
    <form
      ref={form.formRef}
      onSubmit={(event) => {
        // Inside the booking editor this form sits in a dialog; its submit must not reach the booking's form.
        event.stopPropagation();
        submit(event);
      }}
      noValidate
      className="space-y-6"
      aria-label={customer ? `Edit ${customer.name}` : 'New customer'}
      onChange={() => setSaved(false)}
    >
      {customer ? <LiveRegion>{saved ? <Alert tone="success">Customer saved.</Alert> : null}</LiveRegion> : null}
      <FormMessage message={form.formError} />
      <fieldset disabled={readOnly || saving} className="space-y-6">
        <div className="grid gap-4 sm:grid-cols-2">
          <Select label="Customer is" options={typeOptions} {...form.field('type')} />
          <TextField label="Customer name" required autoComplete="off" {...form.field('name')} />
          {form.values.type === 'organization' ? <TextField label="Contact name" autoComplete="off" {...form.field('contactName')} /> : null}
          <TextField label="E-mail" type="email" inputMode="email" autoComplete="off" {...form.field('email')} />
          <TextField label="Phone" type="tel" autoComplete="off" {...form.field('phone')} />
        </div>
        {compact ? null : (
          <fieldset className="space-y-4">
            <legend className="mb-2 text-base font-semibold text-canvas-900">Billing address</legend>
            <TextField label="Address line 1" autoComplete="off" {...form.field('billingLine1')} />
            <TextField label="Address line 2" autoComplete="off" {...form.field('billingLine2')} />
            <div className="grid gap-4 sm:grid-cols-3">
              <TextField label="City" autoComplete="off" {...form.field('billingCity')} />
              <TextField label="State or region" autoComplete="off" {...form.field('billingRegion')} />
              <TextField label="Postal code" autoComplete="off" {...form.field('billingPostalCode')} />
            </div>
          </fieldset>
        )}
        <Checkbox
          label="Tax exempt"
          hint="No sales tax on their bookings. Keep their exemption certificate on file."
          checked={form.values.taxExempt === 'true'}
          onChange={(e) => form.setValue('taxExempt', String(e.target.checked))}
          error={form.errors.taxExempt}
        />
        {compact ? null : <TextArea label="Notes" {...form.field('notes')} />}
      </fieldset>
      {readOnly ? null : (
        <div className="flex flex-wrap gap-2">
          <Button type="submit" isLoading={saving}>
            {saving ? 'Saving…' : customer ? 'Save customer' : 'Create customer'}
          </Button>
          {onCancel ? (
            <Button variant="secondary" onClick={onCancel} disabled={saving}>
              Cancel
            </Button>
          ) : null}
        </div>
      )}
    </form>
  );
}
