import { useState } from 'react';
import { CompanyRules, SEATING_STYLES, type SeatingStyle } from '@shared/schemas/rules';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { TextField } from '@/components/ui/text-field';
import { bpToPercentInput, centsToInput, collector, numberToInput, parseDecimal, parseDollars, parsePercent, parseWhole } from '@/lib/amounts';
import { useZodForm } from '@/lib/form';
import type { RulesResponse } from '../api/get-rules';
import { useUpdateRules } from '../api/update-rules';

/** Field names are the schema's paths ("deliveryBands.0.feeCents"), so its messages land on them. */
type Values = Record<string, string>;

export const SEATING_LABELS: Record<SeatingStyle, string> = {
  banquet: 'Banquet tables',
  rows: 'Rows of chairs',
  standing: 'Standing',
  mixed: 'Mixed (tables and standing)',
};

function toValues(r: CompanyRules): Values {
  const v: Values = {
    taxRateBp: bpToPercentInput(r.taxRateBp),
    depositBp: bpToPercentInput(r.depositBp),
    depositMinCents: centsToInput(r.depositMinCents),
    balanceDueDays: String(r.balanceDueDays),
    damageWaiverBp: bpToPercentInput(r.damageWaiverBp),
    damageWaiverTaxable: String(r.damageWaiverTaxable),
    deliveryTaxable: String(r.deliveryTaxable),
    turnaroundHours: String(r.turnaroundHours),
    permitAreaSqFt: String(r.permitAreaSqFt),
    permitOpenSidedAreaSqFt: String(r.permitOpenSidedAreaSqFt),
    seatsPerBanquetTable: String(r.seatsPerBanquetTable),
    windLimitMph: String(r.windLimitMph),
    occupiedWindLimitMph: String(r.occupiedWindLimitMph),
    signingLinkDays: String(r.signingLinkDays),
    signedCopyDays: String(r.signedCopyDays),
    invoicePrefix: r.invoicePrefix,
    bands: String(r.deliveryBands.length),
  };
  for (const s of SEATING_STYLES) v[`sqFtPerGuest.${s}`] = numberToInput(r.sqFtPerGuest[s]);
  r.deliveryBands.forEach((b, i) => {
    v[`deliveryBands.${i}.upToMiles`] = numberToInput(b.upToMiles);
    v[`deliveryBands.${i}.feeCents`] = centsToInput(b.feeCents);
  });
  return v;
}

function toInput(v: Values) {
  const c = collector();
  c.put('taxRateBp', parsePercent(v.taxRateBp, 4, 0));
  c.put('depositBp', parsePercent(v.depositBp, 2, 0));
  c.put('depositMinCents', parseDollars(v.depositMinCents, 0));
  c.put('balanceDueDays', parseWhole(v.balanceDueDays, 0));
  c.put('damageWaiverBp', parsePercent(v.damageWaiverBp, 2, 0));
  c.input.damageWaiverTaxable = v.damageWaiverTaxable === 'true';
  c.input.deliveryTaxable = v.deliveryTaxable === 'true';
  // Typed in lower case it still reads as the prefix the schema takes.
  c.input.invoicePrefix = v.invoicePrefix.trim().toUpperCase();
  for (const key of ['turnaroundHours', 'permitAreaSqFt', 'permitOpenSidedAreaSqFt', 'seatsPerBanquetTable', 'windLimitMph', 'occupiedWindLimitMph', 'signingLinkDays', 'signedCopyDays']) {
    c.put(key, parseWhole(v[key], 0));
  }
  const sq = collector();
  for (const s of SEATING_STYLES) sq.put(s, parseDecimal(v[`sqFtPerGuest.${s}`], null));
  c.input.sqFtPerGuest = sq.input;
  for (const [k, m] of Object.entries(sq.errors)) c.errors[`sqFtPerGuest.${k}`] = m;
  const bands = [];
  for (let i = 0; i < Number(v.bands); i += 1) {
    const b = collector();
    b.put('upToMiles', parseDecimal(v[`deliveryBands.${i}.upToMiles`] ?? '', null));
    b.put('feeCents', parseDollars(v[`deliveryBands.${i}.feeCents`] ?? '', null));
    bands.push(b.input);
    for (const [k, m] of Object.entries(b.errors)) c.errors[`deliveryBands.${i}.${k}`] = m;
  }
  c.input.deliveryBands = bands;
  return c;
}

const Legend = ({ children }: { children: React.ReactNode }) => <legend className="mb-2 text-base font-semibold text-canvas-900">{children}</legend>;

export function RulesForm({ rules }: { rules: RulesResponse }) {
  const form = useZodForm(CompanyRules, toValues(rules), { toInput });
  const update = useUpdateRules();
  const [saved, setSaved] = useState(false);
  const readOnly = !rules.can.update;
  const bandCount = Number(form.values.bands);

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    setSaved(false);
    update.mutate(data, {
      onSuccess: (next) => {
        form.reset(toValues(next));
        setSaved(true);
      },
      onError: form.showError,
    });
  });

  const check = (name: string) => ({
    checked: form.values[name] === 'true',
    onChange: (e: React.ChangeEvent<HTMLInputElement>) => form.setValue(name, String(e.target.checked)),
  });

  const addBand = () => {
    form.setValue(`deliveryBands.${bandCount}.upToMiles`, '');
    form.setValue(`deliveryBands.${bandCount}.feeCents`, '');
    form.setValue('bands', String(bandCount + 1));
  };
  const removeBand = (index: number) => {
    // Later rows move up one place, so their field names follow.
    for (let i = index; i < bandCount - 1; i += 1) {
      form.setValue(`deliveryBands.${i}.upToMiles`, form.values[`deliveryBands.${i + 1}.upToMiles`] ?? '');
      form.setValue(`deliveryBands.${i}.feeCents`, form.values[`deliveryBands.${i + 1}.feeCents`] ?? '');
    }
    form.setValue('bands', String(bandCount - 1));
  };

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate className="space-y-8" aria-label="Pricing and planning rules" onChange={() => setSaved(false)}>
      <LiveRegion>{saved ? <Alert tone="success">Rules saved. New quotes use them; saved bookings keep their own tax rate.</Alert> : null}</LiveRegion>
      <FormMessage message={form.formError} />
      {readOnly ? <p className="text-sm text-canvas-700">You can read these rules; changing them is the owner’s.</p> : null}
      <fieldset disabled={readOnly || update.isPending} className="space-y-8">
        <fieldset className="space-y-4">
          <Legend>Tax, deposit and balance</Legend>
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            <TextField label="Sales tax rate (%)" inputMode="decimal" hint="Up to 4 decimals, like 8.875. Ask your state for the rate at your address." {...form.field('taxRateBp')} />
            <TextField label="Deposit (%)" inputMode="decimal" hint="Share of the total due at signing." {...form.field('depositBp')} />
            <TextField label="Minimum deposit" inputMode="decimal" hint="In dollars, like 100.00." {...form.field('depositMinCents')} />
            <TextField label="Balance due (days before the event)" inputMode="numeric" {...form.field('balanceDueDays')} />
            <TextField label="Damage waiver (%)" inputMode="decimal" hint="Share of the rental lines." {...form.field('damageWaiverBp')} />
          </div>
          <div className="flex flex-wrap gap-6">
            <Checkbox label="Damage waiver is taxable" hint="This varies by state." {...check('damageWaiverTaxable')} />
            <Checkbox label="Delivery is taxable" hint="This varies by state." {...check('deliveryTaxable')} />
          </div>
        </fieldset>

        <fieldset className="space-y-3">
          <Legend>Delivery fee by distance</Legend>
          <p className="-mt-2 text-sm text-canvas-600">Each band covers deliveries up to its distance; beyond the last, the last band’s fee applies.</p>
          {bandCount === 0 ? <p className="text-sm text-canvas-700">No bands: delivery is free unless you add a line for it.</p> : null}
          <ol className="space-y-3">
            {Array.from({ length: bandCount }, (_, i) => (
              <li key={i} className="grid items-end gap-3 sm:grid-cols-[1fr_1fr_auto]">
                <TextField label={`Band ${i + 1}: up to (miles)`} inputMode="decimal" {...form.field(`deliveryBands.${i}.upToMiles`)} />
                <TextField label={`Band ${i + 1}: fee`} inputMode="decimal" {...form.field(`deliveryBands.${i}.feeCents`)} />
                {readOnly ? null : (
                  <Button variant="ghost" className="text-rust-700 hover:bg-rust-50" onClick={() => removeBand(i)}>
                    Remove band {i + 1}
                  </Button>
                )}
              </li>
            ))}
          </ol>
          {form.errors.deliveryBands ? <p className="text-sm font-semibold text-rust-700">{form.errors.deliveryBands}</p> : null}
          {readOnly || bandCount >= 20 ? null : (
            <Button variant="secondary" size="sm" onClick={addBand}>
              Add a band
            </Button>
          )}
        </fieldset>

        <fieldset className="space-y-4">
          <Legend>Availability</Legend>
          <TextField className="max-w-xs" label="Turnaround after pickup (hours)" inputMode="numeric" hint="Cleaning and drying canvas before the next rental." {...form.field('turnaroundHours')} />
        </fieldset>

        <fieldset className="space-y-4">
          <Legend>Tent permits</Legend>
          <p className="-mt-2 max-w-prose text-sm text-canvas-700">
            IFC 2018 §3103.2 asks for a permit for tents above 400 sq ft, or above 700 sq ft when open on all sides. States and cities amend
            these numbers: ask your local fire code official and set theirs here.
          </p>
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField label="Permit above (sq ft)" inputMode="numeric" {...form.field('permitAreaSqFt')} />
            <TextField label="Open-sided tents: permit above (sq ft)" inputMode="numeric" {...form.field('permitOpenSidedAreaSqFt')} />
          </div>
        </fieldset>

        <fieldset className="space-y-4">
          <Legend>Sizing a tent</Legend>
          <p className="-mt-2 text-sm text-canvas-600">Floor area planned per guest. The planner never goes beyond what the fire code allows.</p>
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
            {SEATING_STYLES.map((s) => (
              <TextField key={s} label={`${SEATING_LABELS[s]} (sq ft per guest)`} inputMode="decimal" {...form.field(`sqFtPerGuest.${s}`)} />
            ))}
          </div>
          <TextField className="max-w-xs" label="Seats per banquet table" inputMode="numeric" hint="When the table item does not say." {...form.field('seatsPerBanquetTable')} />
        </fieldset>

        <fieldset className="space-y-4">
          <Legend>Wind</Legend>
          <TextField
            className="max-w-xs"
            label="Wind limit (mph)"
            inputMode="numeric"
            hint="Take tents down or clear them at this sustained wind. When a tent maker rates a tent lower, follow the manufacturer’s rating."
            {...form.field('windLimitMph')}
          />
          <TextField
            className="max-w-xs"
            label="Guests out of the tent at (mph)"
            inputMode="numeric"
            hint="Nobody stays inside a tent at this sustained wind. Default 30 mph, after trade-association guidance that above 30–38 mph it is too hazardous to stay inside; a lower manufacturer’s rating comes first."
            {...form.field('occupiedWindLimitMph')}
          />
        </fieldset>
        <fieldset className="space-y-4">
          <Legend>Invoices</Legend>
          <TextField
            className="max-w-xs"
            label="Invoice number prefix"
            autoComplete="off"
            autoCapitalize="characters"
            spellCheck={false}
            maxLength={8}
            hint="Invoices read PREFIX-YEAR-NUMBER, like INV-2027-0001."
            {...form.field('invoicePrefix')}
          />
        </fieldset>
        <fieldset className="space-y-4">
          <Legend>Signing online</Legend>
          <TextField
            className="max-w-xs"
            label="Signing link works for (days)"
            inputMode="numeric"
            hint="After this many days the customer needs a new link."
            {...form.field('signingLinkDays')}
          />
          <TextField
            className="max-w-xs"
            label="Signed copy can be downloaded for (days)"
            inputMode="numeric"
            hint="How long the customer's link keeps offering the signed PDF. It was also e-mailed to them."
            {...form.field('signedCopyDays')}
          />
        </fieldset>
      </fieldset>
      {readOnly ? null : (
        <Button type="submit" isLoading={update.isPending}>
          {update.isPending ? 'Saving…' : 'Save rules'}
        </Button>
      )}
    </form>
  );
}
