import { useEffect, useRef, useState, type FormEvent } from 'react';
import { beaufortForMph, describeBeaufort } from '@shared/beaufort';
import { PRIVATE_LINES, PRIVATE_LINES_LABELS, SiteCheckInput, type FieldBooking, type PrivateLines } from '@shared/schemas/field';
import { stakingReadiness } from '@shared/siteSafety';
import { Alert, FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { Select } from '@/components/ui/select';
import { TextArea } from '@/components/ui/textarea';
import { TextField } from '@/components/ui/text-field';
import { parseDecimal, parseWhole, numberToInput } from '@/lib/amounts';
import { errorMessage, isApiError } from '@/lib/api';
import { zodFieldErrors, type FieldErrors } from '@/lib/form';
import { useMarkReadyToStake } from '../api/mark-ready-to-stake';
import { useSaveSiteCheck } from '../api/save-site-check';

interface Values {
  locateRequested: boolean;
  locateRequestedOn: string;
  locateNumber: string;
  hardSurfaceBallast: boolean;
  privateLines: PrivateLines;
  privateLinesNotes: string;
  buildingClearanceFt: string;
  lotLineClearanceFt: string;
  windMph: string;
  exitsPlanned: boolean;
  notes: string;
}

const valuesOf = (c: FieldBooking['siteCheck']): Values => ({
  locateRequested: c.locateRequested,
  locateRequestedOn: c.locateRequestedOn ?? '',
  locateNumber: c.locateNumber,
  hardSurfaceBallast: c.hardSurfaceBallast,
  privateLines: c.privateLines,
  privateLinesNotes: c.privateLinesNotes,
  buildingClearanceFt: numberToInput(c.buildingClearanceFt),
  lotLineClearanceFt: numberToInput(c.lotLineClearanceFt),
  windMph: numberToInput(c.windMph),
  exitsPlanned: c.exitsPlanned,
  notes: c.notes,
});

/** IFC 2018 §3103.8.2: 20 ft from buildings and lot lines unless the fire code official allows less. */
const CLEARANCE_FT = 20;

function toInput(v: Values): { input: Record<string, unknown>; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const input: Record<string, unknown> = {
    locateRequested: v.locateRequested,
    locateRequestedOn: v.locateRequestedOn || null,
    locateNumber: v.locateNumber,
    hardSurfaceBallast: v.hardSurfaceBallast,
    privateLines: v.privateLines,
    privateLinesNotes: v.privateLinesNotes,
    exitsPlanned: v.exitsPlanned,
    notes: v.notes,
  };
  for (const key of ['buildingClearanceFt', 'lotLineClearanceFt'] as const) {
    const p = parseDecimal(v[key], null);
    if (p.ok) input[key] = p.value;
    else errors[key] = p.message;
  }
  const w = parseWhole(v.windMph, null);
  if (w.ok) input.windMph = w.value;
  else errors.windMph = w.message;
  return { input, errors };
}

/** The site checklist: locate, private lines, clearances, wind and exits; then staking is marked ready. */
export function SiteCheckForm({ booking }: { booking: FieldBooking }) {
  const bookingId = booking.delivery.bookingId;
  const [values, setValues] = useState<Values>(() => valuesOf(booking.siteCheck));
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const save = useSaveSiteCheck(bookingId);
  const ready = useMarkReadyToStake(bookingId);
  const formRef = useRef<HTMLFormElement>(null);
  const readOnly = !booking.can.work;

  // A saved check from elsewhere (another phone) becomes the form's new starting point.
  const loadedAt = booking.siteCheck.updatedAt;
  useEffect(() => setValues(valuesOf(booking.siteCheck)), [loadedAt]); // eslint-disable-line react-hooks/exhaustive-deps

  const set = <K extends keyof Values>(key: K, value: Values[K]) => {
    setSaved(null);
    setErrors(({ [key]: _gone, ...rest }) => rest);
    setValues((v) => ({ ...v, [key]: value }));
  };
  const showServer = (error: unknown) => {
    if (isApiError(error) && Object.keys(error.fields).length) setErrors(error.fields);
    setFormError(errorMessage(error));
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    saveThen();
  };

  /** Saves the checklist as typed; `andMarkReady` then marks staking ready on what was saved. */
  const saveThen = (andMarkReady = false) => {
    setFormError(null);
    const { input, errors: parseErrors } = toInput(values);
    const checked = SiteCheckInput.safeParse(input);
    const all = { ...(checked.success ? {} : zodFieldErrors(checked.error)), ...parseErrors };
    if (Object.keys(all).length) {
      setErrors(all);
      setFormError('Check the highlighted fields.');
      requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
      return;
    }
    save.mutate(
      { bookingId, ...(checked.data as SiteCheckInput) },
      {
        onSuccess: () => {
          setSaved('Checklist saved.');
          if (andMarkReady) ready.mutate(undefined, { onError: showServer });
        },
        onError: showServer,
      },
    );
  };

  const wind = parseWhole(values.windMph, null);
  const windMph = wind.ok ? wind.value : null;
  const lotLine = parseDecimal(values.lotLineClearanceFt, null);
  const building = parseDecimal(values.buildingClearanceFt, null);
  const tooClose = [building, lotLine].some((p) => p.ok && p.value !== null && p.value < CLEARANCE_FT);
  const preview = stakingReadiness({ locateNumber: values.locateNumber, hardSurfaceBallast: values.hardSurfaceBallast });
  const exits = booking.safety.tents[0]?.exits;
  const isReady = booking.siteCheck.readyToStake.ready;

  return (
    <form ref={formRef} noValidate onSubmit={submit} className="space-y-6" aria-label="Site checklist">
      <fieldset className="space-y-3" disabled={readOnly}>
        <legend className="text-base font-semibold text-canvas-900">Utility locate (811)</legend>
        <p className="text-sm text-canvas-700">
          Call 811 or the local one-call center a few working days before any stake goes in, and wait until the lines are marked. Write the ticket number here.
        </p>
        <Checkbox label="Locate requested" checked={values.locateRequested} onChange={(e) => set('locateRequested', e.target.checked)} />
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField label="Requested on" type="date" value={values.locateRequestedOn} onChange={(e) => set('locateRequestedOn', e.target.value)} error={errors.locateRequestedOn} />
          <TextField
            label="Locate ticket number"
            autoComplete="off"
            value={values.locateNumber}
            maxLength={60}
            onChange={(e) => set('locateNumber', e.target.value)}
            error={errors.locateNumber}
          />
        </div>
        <Checkbox
          label="Hard surface, held with ballast only: no stake goes into the ground"
          hint={`The booking says ${booking.delivery.site.surface}, ${booking.delivery.site.anchoring}.`}
          checked={values.hardSurfaceBallast}
          onChange={(e) => set('hardSurfaceBallast', e.target.checked)}
        />
      </fieldset>

      <fieldset className="space-y-3" disabled={readOnly}>
        <legend className="text-base font-semibold text-canvas-900">Private lines</legend>
        <p className="text-sm text-canvas-700">The locate marks public lines only. Ask the customer to show sprinklers, propane, septic, pool and power to outbuildings.</p>
        <Select
          label="Private lines shown by the customer"
          options={PRIVATE_LINES.map((p) => ({ value: p, label: PRIVATE_LINES_LABELS[p] }))}
          value={values.privateLines}
          onChange={(e) => set('privateLines', e.target.value as PrivateLines)}
          error={errors.privateLines}
        />
        <TextArea label="Where they run" rows={2} value={values.privateLinesNotes} onChange={(e) => set('privateLinesNotes', e.target.value)} error={errors.privateLinesNotes} />
      </fieldset>

      <fieldset className="space-y-3" disabled={readOnly}>
        <legend className="text-base font-semibold text-canvas-900">Clearances</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField label="From the nearest building (ft)" inputMode="decimal" value={values.buildingClearanceFt} onChange={(e) => set('buildingClearanceFt', e.target.value)} error={errors.buildingClearanceFt} />
          <TextField label="From the nearest lot line (ft)" inputMode="decimal" value={values.lotLineClearanceFt} onChange={(e) => set('lotLineClearanceFt', e.target.value)} error={errors.lotLineClearanceFt} />
        </div>
        {tooClose ? (
          <Alert tone="warning">Less than {CLEARANCE_FT} ft (IFC 2018 §3103.8.2): only where the fire code official allows it. Call the office before you set up.</Alert>
        ) : null}
      </fieldset>

      <fieldset className="space-y-3" disabled={readOnly}>
        <legend className="text-base font-semibold text-canvas-900">Wind and exits</legend>
        <TextField
          label="Sustained wind now or forecast (mph)"
          inputMode="numeric"
          value={values.windMph}
          onChange={(e) => set('windMph', e.target.value)}
          error={errors.windMph}
          hint={windMph !== null ? describeBeaufort(beaufortForMph(windMph)) : `Guests out at ${booking.safety.wind.occupied.mph} mph; take down at ${booking.safety.wind.takeDown.mph} mph.`}
        />
        {windMph !== null && windMph >= booking.safety.wind.takeDown.mph ? (
          <Alert tone="danger">At or above the take-down limit ({booking.safety.wind.takeDown.mph} mph): do not set up; take standing tents down if it is safe to.</Alert>
        ) : windMph !== null && windMph >= booking.safety.wind.occupied.mph ? (
          <Alert tone="warning">At or above {booking.safety.wind.occupied.mph} mph nobody stays inside the tent. Tell the customer and the office.</Alert>
        ) : null}
        <Checkbox
          label={exits ? `Exits laid out: ${exits.count}, each at least ${exits.minWidthIn} in wide, kept clear` : 'Exits laid out and kept clear'}
          checked={values.exitsPlanned}
          onChange={(e) => set('exitsPlanned', e.target.checked)}
        />
        <TextArea label="Notes" rows={3} value={values.notes} onChange={(e) => set('notes', e.target.value)} error={errors.notes} />
      </fieldset>

      <FormMessage message={formError} />
      {saved ? <Alert tone="success">{saved}</Alert> : null}
      {!readOnly ? (
        <div className="flex flex-wrap gap-2">
          <Button type="submit" isLoading={save.isPending}>
            Save checklist
          </Button>
        </div>
      ) : null}

      <section aria-labelledby="ready-heading" className="space-y-2 border-t border-canvas-200 pt-4">
        <h2 id="ready-heading" className="text-base font-semibold text-canvas-900">
          Ready to stake
        </h2>
        {isReady ? (
          <Alert tone="success" title="Staking is marked ready.">
            {booking.siteCheck.locateNumber ? `Locate ticket ${booking.siteCheck.locateNumber}.` : 'Hard surface held with ballast.'}
          </Alert>
        ) : (
          <>
            <p className="text-sm text-canvas-700">{preview.ready ? 'The checklist allows it: save and mark staking ready.' : preview.reason}</p>
            {!readOnly ? (
              <Button variant="secondary" isLoading={ready.isPending || (save.isPending && !saved)} onClick={() => saveThen(true)}>
                Save and mark staking ready
              </Button>
            ) : null}
          </>
        )}
      </section>
    </form>
  );
}
