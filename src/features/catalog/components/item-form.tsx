import { useState } from 'react';
import { ItemInput, type ItemKind, type ItemRow } from '@shared/schemas/items';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { Select } from '@/components/ui/select';
import { TextArea } from '@/components/ui/textarea';
import { TextField } from '@/components/ui/text-field';
import { centsToInput, collector, numberToInput, parseDecimal, parseDollars, parseWhole } from '@/lib/amounts';
import { useZodForm } from '@/lib/form';
import { useCreateItem } from '../api/create-item';
import { useUpdateItem } from '../api/update-item';
import { KIND_FIELDS, kindOptions, serviceTypeOptions, tentTypeOptions } from './item-kinds';

const FIELDS = [
  'name',
  'kind',
  'sku',
  'description',
  'quantityOwned',
  'rentalPriceCents',
  'extraDayPriceCents',
  'replacementValueCents',
  'purchaseCostCents',
  'taxable',
  'active',
  'tentType',
  'widthFt',
  'lengthFt',
  'heightFt',
  'sectionLengthFt',
  'seats',
  'polesPerSetup',
  'stakesPerSetup',
  'ballastPerSetupLbs',
  'serviceType',
] as const;
type FormValues = Record<(typeof FIELDS)[number], string>;

const MONEY = ['rentalPriceCents', 'extraDayPriceCents', 'replacementValueCents', 'purchaseCostCents'] as const;
const FEET = ['widthFt', 'lengthFt', 'heightFt', 'sectionLengthFt'] as const;
const COUNTS = ['seats', 'polesPerSetup', 'stakesPerSetup', 'ballastPerSetupLbs'] as const;

export const EMPTY_ITEM: FormValues = {
  name: '',
  kind: 'tent',
  sku: '',
  description: '',
  quantityOwned: '0',
  rentalPriceCents: '',
  extraDayPriceCents: '',
  replacementValueCents: '',
  purchaseCostCents: '',
  taxable: 'true',
  active: 'true',
  tentType: '',
  widthFt: '',
  lengthFt: '',
  heightFt: '',
  sectionLengthFt: '',
  seats: '',
  polesPerSetup: '',
  stakesPerSetup: '',
  ballastPerSetupLbs: '',
  serviceType: '',
};

function toValues(item: ItemRow): FormValues {
  return {
    name: item.name,
    kind: item.kind,
    sku: item.sku,
    description: item.description,
    quantityOwned: String(item.quantityOwned),
    rentalPriceCents: centsToInput(item.rentalPriceCents),
    extraDayPriceCents: centsToInput(item.extraDayPriceCents),
    replacementValueCents: centsToInput(item.replacementValueCents),
    purchaseCostCents: centsToInput(item.purchaseCostCents),
    taxable: String(item.taxable),
    active: String(item.active),
    tentType: item.tentType ?? '',
    widthFt: numberToInput(item.widthFt),
    lengthFt: numberToInput(item.lengthFt),
    heightFt: numberToInput(item.heightFt),
    sectionLengthFt: numberToInput(item.sectionLengthFt),
    seats: numberToInput(item.seats),
    polesPerSetup: numberToInput(item.polesPerSetup),
    stakesPerSetup: numberToInput(item.stakesPerSetup),
    ballastPerSetupLbs: numberToInput(item.ballastPerSetupLbs),
    serviceType: item.serviceType ?? '',
  };
}

/** The typed strings as an ItemInput; fields the kind does not use go as null. */
function toInput(v: FormValues, keepPrices: ItemRow | null) {
  const uses = new Set(KIND_FIELDS[v.kind as ItemKind] ?? []);
  const c = collector();
  c.input.name = v.name;
  c.input.kind = v.kind || undefined;
  c.input.sku = v.sku;
  c.input.description = v.description;
  c.put('quantityOwned', parseWhole(v.quantityOwned, 0));
  if (keepPrices) {
    // Someone who may not see prices never sends them back as zeros.
    for (const key of MONEY) c.input[key] = keepPrices[key];
  } else {
    c.put('rentalPriceCents', parseDollars(v.rentalPriceCents, null));
    for (const key of MONEY.slice(1)) c.put(key, parseDollars(v[key], 0));
  }
  c.input.taxable = v.taxable === 'true';
  c.input.active = v.active === 'true';
  c.input.tentType = uses.has('tentType') ? v.tentType || null : null;
  c.input.serviceType = uses.has('serviceType') ? v.serviceType || null : null;
  for (const key of FEET) (uses.has(key) ? c.put(key, parseDecimal(v[key], null)) : (c.input[key] = null));
  for (const key of COUNTS) (uses.has(key) ? c.put(key, parseWhole(v[key], null)) : (c.input[key] = null));
  if (c.input.rentalPriceCents === null) delete c.input.rentalPriceCents;
  return c;
}

interface ItemFormProps {
  /** The item being edited, or null for a new one. */
  item: ItemRow | null;
  showPrices: boolean;
  readOnly?: boolean;
  onSaved?: (item: ItemRow) => void;
}

export function ItemForm({ item, showPrices, readOnly = false, onSaved }: ItemFormProps) {
  const form = useZodForm(ItemInput, item ? toValues(item) : EMPTY_ITEM, {
    toInput: (v) => toInput(v, showPrices ? null : item),
  });
  const create = useCreateItem();
  const update = useUpdateItem();
  const saving = create.isPending || update.isPending;
  const [saved, setSaved] = useState(false);
  const kind = form.values.kind as ItemKind;
  const uses = new Set(KIND_FIELDS[kind] ?? []);

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    setSaved(false);
    const options = {
      onSuccess: (next: ItemRow) => {
        form.reset(toValues(next));
        setSaved(true);
        onSaved?.(next);
      },
      onError: form.showError,
    };
    if (item) update.mutate({ id: item.id, body: data }, options);
    else create.mutate(data, options);
  });

  const check = (name: 'taxable' | 'active') => ({
    checked: form.values[name] === 'true',
    onChange: (event: React.ChangeEvent<HTMLInputElement>) => form.setValue(name, String(event.target.checked)),
    error: form.errors[name],
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate className="space-y-6" aria-label={item ? `Edit ${item.name}` : 'New item'} onChange={() => setSaved(false)}>
      <LiveRegion>{saved ? <Alert tone="success">Item saved.</Alert> : null}</LiveRegion>
      <FormMessage message={form.formError} />
      <fieldset disabled={readOnly || saving} className="space-y-6">
        <fieldset className="space-y-4">
          <legend className="mb-2 text-base font-semibold text-canvas-900">Item</legend>
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField label="Name" required autoComplete="off" {...form.field('name')} />
            <Select label="Kind" options={kindOptions} {...form.field('kind')} />
            <TextField label="SKU" autoComplete="off" hint="Your own stock code; optional." {...form.field('sku')} />
            {kind !== 'service' ? (
              <TextField label="Quantity owned" inputMode="numeric" {...form.field('quantityOwned')} />
            ) : null}
          </div>
          <TextArea label="Description" {...form.field('description')} />
          <div className="flex flex-wrap gap-6">
            <Checkbox label="Taxable" hint="Sales tax applies when it is rented." {...check('taxable')} />
            <Checkbox label="Active" hint="Inactive items stay on old bookings but cannot be added to new ones." {...check('active')} />
          </div>
        </fieldset>

        {showPrices ? (
          <fieldset className="space-y-4">
            <legend className="mb-2 text-base font-semibold text-canvas-900">Prices</legend>
            <p className="-mt-2 text-sm text-canvas-600">In dollars and cents, like 125.00.</p>
            <div className="grid gap-4 sm:grid-cols-2">
              <TextField label="Rental price" inputMode="decimal" required hint="For the first day." {...form.field('rentalPriceCents')} />
              <TextField label="Extra day price" inputMode="decimal" hint="Each day after the first." {...form.field('extraDayPriceCents')} />
              <TextField label="Replacement value" inputMode="decimal" hint="What a lost or ruined one costs the customer." {...form.field('replacementValueCents')} />
              <TextField label="Purchase cost" inputMode="decimal" {...form.field('purchaseCostCents')} />
            </div>
          </fieldset>
        ) : null}

        {uses.size > 0 ? (
          <fieldset className="space-y-4">
            <legend className="mb-2 text-base font-semibold text-canvas-900">
              {kind === 'tent' ? 'Tent' : kind === 'sidewall' ? 'Sidewall' : kind === 'table' ? 'Table' : 'Service'}
            </legend>
            <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
              {uses.has('tentType') ? <Select label="Tent type" options={tentTypeOptions} placeholder="Choose pole or frame" {...form.field('tentType')} /> : null}
              {uses.has('widthFt') ? <TextField label="Width (ft)" inputMode="decimal" hint="The shorter side." {...form.field('widthFt')} /> : null}
              {uses.has('lengthFt') ? <TextField label="Length (ft)" inputMode="decimal" {...form.field('lengthFt')} /> : null}
              {uses.has('sectionLengthFt') ? <TextField label="Section length (ft)" inputMode="decimal" {...form.field('sectionLengthFt')} /> : null}
              {uses.has('heightFt') ? <TextField label="Height (ft)" inputMode="decimal" {...form.field('heightFt')} /> : null}
              {uses.has('seats') ? <TextField label="Seats" inputMode="numeric" hint="Guests one table seats." {...form.field('seats')} /> : null}
              {uses.has('polesPerSetup') ? <TextField label="Poles per set-up" inputMode="numeric" {...form.field('polesPerSetup')} /> : null}
              {uses.has('stakesPerSetup') ? <TextField label="Stakes per set-up" inputMode="numeric" {...form.field('stakesPerSetup')} /> : null}
              {uses.has('ballastPerSetupLbs') ? (
                <TextField label="Ballast per set-up (lbs)" inputMode="numeric" hint="Where stakes cannot go in: follow the tent maker’s ballast table." {...form.field('ballastPerSetupLbs')} />
              ) : null}
              {uses.has('serviceType') ? <Select label="Service type" options={serviceTypeOptions} placeholder="Choose a service type" {...form.field('serviceType')} /> : null}
            </div>
          </fieldset>
        ) : null}
      </fieldset>
      {readOnly ? null : (
        <Button type="submit" isLoading={saving}>
          {saving ? 'Saving…' : item ? 'Save item' : 'Create item'}
        </Button>
      )}
    </form>
  );
}
