import { ANCHORING, SURFACES } from '@shared/schemas/bookings';
import { SEATING_STYLES } from '@shared/schemas/rules';
import { Checkbox } from '@/components/ui/checkbox';
import { Select } from '@/components/ui/select';
import { TextArea } from '@/components/ui/textarea';
import { TextField } from '@/components/ui/text-field';
import type { FieldErrors } from '@/lib/form';
import type { BookingState } from './editor-state';

type StringKeys = { [K in keyof BookingState]: BookingState[K] extends string ? K : never }[keyof BookingState];
type BoolKeys = { [K in keyof BookingState]: BookingState[K] extends boolean ? K : never }[keyof BookingState];

export interface FieldsProps {
  state: BookingState;
  errors: FieldErrors;
  set: (patch: Partial<BookingState>) => void;
}

export function binder({ state, errors, set }: FieldsProps) {
  return {
    text: (name: StringKeys, errorKey: string = name) => ({
      value: state[name] as string,
      error: errors[errorKey],
      onChange: (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement>) => set({ [name]: e.target.value } as Partial<BookingState>),
    }),
    check: (name: BoolKeys) => ({
      checked: state[name] as boolean,
      error: errors[name],
      onChange: (e: React.ChangeEvent<HTMLInputElement>) => set({ [name]: e.target.checked } as Partial<BookingState>),
    }),
  };
}

const SURFACE_LABELS: Record<(typeof SURFACES)[number], string> = { grass: 'Grass', soil: 'Soil', gravel: 'Gravel', asphalt: 'Asphalt', concrete: 'Concrete' };
const ANCHORING_LABELS: Record<(typeof ANCHORING)[number], string> = { stakes: 'Stakes', ballast: 'Ballast' };
export const SEATING_OPTION_LABELS = { banquet: 'Banquet tables', rows: 'Rows of chairs', standing: 'Standing', mixed: 'Mixed (tables and standing)' } as const;

export function WindowFields(props: FieldsProps & { timeZone: string }) {
  const b = binder(props);
  const hint = `On the company’s clock (${props.timeZone.replaceAll('_', ' ')}).`;
  return (
    <div className="space-y-4">
      <p className="text-sm text-canvas-600">{hint}</p>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Event starts" type="datetime-local" {...b.text('eventStart')} />
        <TextField label="Event ends" type="datetime-local" {...b.text('eventEnd')} />
        <TextField label="Delivery from" type="datetime-local" {...b.text('deliveryStart')} />
        <TextField label="Delivery until" type="datetime-local" {...b.text('deliveryEnd')} />
        <TextField label="Pickup from" type="datetime-local" {...b.text('pickupStart')} />
        <TextField label="Pickup until" type="datetime-local" {...b.text('pickupEnd')} />
      </div>
    </div>
  );
}

export function SiteFields(props: FieldsProps) {
  const b = binder(props);
  const staking = props.state.anchoring === 'stakes';
  return (
    <div className="space-y-4">
      <TextField label="Site address line 1" autoComplete="off" {...b.text('siteLine1')} />
      <TextField label="Site address line 2" autoComplete="off" {...b.text('siteLine2')} />
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField label="Site city" autoComplete="off" {...b.text('siteCity')} />
        <TextField label="Site state or region" autoComplete="off" {...b.text('siteRegion')} />
        <TextField label="Site postal code" autoComplete="off" {...b.text('sitePostalCode')} />
      </div>
      <TextArea label="Site notes" hint="Gate width, slope, where trucks may drive, overhead lines, sprinklers." {...b.text('siteNotes')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <Select label="Surface" options={SURFACES.map((s) => ({ value: s, label: SURFACE_LABELS[s] }))} {...b.text('surface')} />
        <Select label="Anchoring" options={ANCHORING.map((a) => ({ value: a, label: ANCHORING_LABELS[a] }))} {...b.text('anchoring')} />
        <TextField label="Utility-locate ticket number" autoComplete="off" {...b.text('utilityLocateNumber')} />
        <TextField label="Utility-locate date" type="date" {...b.text('utilityLocateDate')} />
      </div>
      {staking ? (
        <p className="rounded-md border border-ochre-200 bg-ochre-50 px-3 py-2 text-sm text-ochre-800">
          Before staking: request a utility locate (811 in the US) a few working days ahead, wait for the marks, and stake clear of them. Your state’s one-call law sets the notice.
        </p>
      ) : (
        <p className="rounded-md border border-ochre-200 bg-ochre-50 px-3 py-2 text-sm text-ochre-800">
          Ballast: use the weights the tent maker’s instructions give for this tent and the expected wind.
        </p>
      )}
    </div>
  );
}

export function GuestFields(props: FieldsProps) {
  const b = binder(props);
  return (
    <div className="grid gap-4 sm:grid-cols-3 sm:items-start">
      <TextField label="Guest count" inputMode="numeric" {...b.text('guestCount')} />
      <Select label="Seating" options={SEATING_STYLES.map((s) => ({ value: s, label: SEATING_OPTION_LABELS[s] }))} {...b.text('seating')} />
      <Checkbox className="sm:pt-7" label="Runs after dark" hint="Plan lighting." {...b.check('afterDark')} />
    </div>
  );
}

export function ChargeFields(props: FieldsProps & { companyTaxRate: string }) {
  const b = binder(props);
  return (
    <div className="space-y-4">
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <TextField label="Delivery distance (miles)" inputMode="decimal" hint="Empty: the customer picks up." {...b.text('deliveryMiles')} />
        <TextField label="Set-up labor" inputMode="decimal" hint="In dollars." {...b.text('setupLabor', 'setupLaborCents')} />
        <TextField label="Booking discount (%)" inputMode="decimal" {...b.text('discountPercent', 'discountBp')} />
        <TextField label="Booking discount (amount)" inputMode="decimal" {...b.text('discountAmount', 'discountCents')} />
        <TextField label="Tax rate (%)" inputMode="decimal" hint={`Empty: the company’s rate, now ${props.companyTaxRate}%.`} {...b.text('taxRatePercent', 'taxRateBp')} />
        <TextField label="Security deposit" inputMode="decimal" hint="Refundable; not taxed." {...b.text('securityDeposit', 'securityDepositCents')} />
      </div>
      <div className="flex flex-wrap gap-6">
        <Checkbox label="Damage waiver" hint="A share of the rentals that covers accidental damage." {...b.check('damageWaiver')} />
        <Checkbox label="Customer shows their own insurance" hint="No damage waiver is charged." {...b.check('ownInsurance')} />
      </div>
    </div>
  );
}
