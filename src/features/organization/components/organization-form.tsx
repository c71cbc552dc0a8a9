import { useMemo, useState } from 'react';
import { CURRENCIES, OrganizationSettings, type OrganizationResponse } from '@shared/schemas/organization';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Select } from '@/components/ui/select';
import { TextField } from '@/components/ui/text-field';
import { useZodForm } from '@/lib/form';
import { useUpdateOrganization } from '../api/update-organization';
import { timeZoneOptions } from './time-zones';

const FIELDS = ['name', 'addressLine1', 'addressLine2', 'city', 'region', 'postalCode', 'country', 'phone', 'email', 'currency', 'timeZone'] as const;
type FormValues = Record<(typeof FIELDS)[number], string>;

function toValues(o: OrganizationResponse): FormValues {
  return Object.fromEntries(FIELDS.map((key) => [key, o[key] ?? ''])) as FormValues;
}

const currencyOptions = CURRENCIES.map((code) => ({ value: code, label: code }));

export function OrganizationForm({ organization, onSaved }: { organization: OrganizationResponse; onSaved?: (o: OrganizationResponse) => void }) {
  const form = useZodForm(OrganizationSettings, toValues(organization));
  const update = useUpdateOrganization();
  const [saved, setSaved] = useState(false);
  const zones = useMemo(() => timeZoneOptions(form.values.timeZone).map((z) => ({ value: z, label: z.replaceAll('_', ' ') })), [form.values.timeZone]);

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    setSaved(false);
    // Send only what changed; the server accepts any subset.
    const before = OrganizationSettings.safeParse(toValues(organization));
    const changes = Object.fromEntries(
      Object.entries(data).filter(([key, value]) => !before.success || before.data[key as keyof typeof data] !== value),
    );
    update.mutate(changes, {
      onSuccess: (next) => {
        form.reset(toValues(next));
        setSaved(true);
        onSaved?.(next);
      },
      onError: form.showError,
    });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate className="space-y-6" onChange={() => setSaved(false)}>
      <LiveRegion>{saved ? <Alert tone="success">Company settings saved.</Alert> : null}</LiveRegion>
      <FormMessage message={form.formError} />

      <fieldset className="space-y-4">
        <legend className="mb-2 text-base font-semibold text-canvas-900">Company</legend>
        <TextField label="Company name" autoComplete="organization" required {...form.field('name')} />
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Phone" type="tel" autoComplete="tel" {...form.field('phone')} />
          <TextField label="E-mail for customers" type="email" autoComplete="email" hint="Shown on quotes and invoices." {...form.field('email')} />
        </div>
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="mb-2 text-base font-semibold text-canvas-900">Address</legend>
        <TextField label="Address line 1" autoComplete="address-line1" {...form.field('addressLine1')} />
        <TextField label="Address line 2" autoComplete="address-line2" {...form.field('addressLine2')} />
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="City" autoComplete="address-level2" {...form.field('city')} />
          <TextField label="State or region" autoComplete="address-level1" {...form.field('region')} />
          <TextField label="Postal code" autoComplete="postal-code" {...form.field('postalCode')} />
          <TextField label="Country" autoComplete="country" maxLength={2} hint="Two-letter code, like US or CA." {...form.field('country')} />
        </div>
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="mb-2 text-base font-semibold text-canvas-900">Money and time</legend>
        <div className="grid gap-4 sm:grid-cols-2">
          <Select label="Currency" options={currencyOptions} placeholder="Choose a currency" {...form.field('currency')} />
          <Select label="Time zone" options={zones} placeholder="Choose a time zone" hint="Event dates and reminders use it." {...form.field('timeZone')} />
        </div>
      </fieldset>

      <Button type="submit" isLoading={update.isPending}>
        {update.isPending ? 'Saving…' : 'Save settings'}
      </Button>
    </form>
  );
}
