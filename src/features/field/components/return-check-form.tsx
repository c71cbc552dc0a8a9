import { useEffect, useRef, useState } from 'react';
import type { FieldBooking, ReturnCheckInput } from '@shared/schemas/field';
import { Alert, FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextArea } from '@/components/ui/textarea';
import { TextField } from '@/components/ui/text-field';
import { parseWhole } from '@/lib/amounts';
import { errorMessage, isApiError } from '@/lib/api';
import { formatZoned } from '@/lib/zoned-time';
import type { FieldErrors } from '@/lib/form';
import { useSaveReturnCheck } from '../api/save-return-check';
import { PhotoList } from './photo-list';
import { PhotoUpload } from './photo-upload';

interface LineValues {
  key: string;
  returned: string;
  damaged: string;
  notes: string;
}

const valuesOf = (check: FieldBooking['returnCheck']) => ({
  notes: check.notes,
  lines: check.lines.map((l) => ({ key: l.key, returned: String(l.returned), damaged: String(l.damaged), notes: l.notes })),
});

/**
 * The pickup check-in on a phone: for each line, how many came back and how many of those are
 * damaged (with a note and photos); what did not come back is missing. Finishing it makes the
 * booking returned, and the office sees the damage as proposed charges.
 */
export function ReturnCheckForm({ booking }: { booking: FieldBooking }) {
  const bookingId = booking.pickup.bookingId;
  const check = booking.returnCheck;
  const [values, setValues] = useState(() => valuesOf(check));
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const save = useSaveReturnCheck(bookingId);
  const formRef = useRef<HTMLFormElement>(null);
  const finished = !!check.submittedAt;
  const editable = booking.can.checkIn;

  useEffect(() => setValues(valuesOf(check)), [check.savedAt, check.submittedAt]); // eslint-disable-line react-hooks/exhaustive-deps

  const setLine = (i: number, patch: Partial<LineValues>) => {
    setSaved(null);
    setErrors((prev) => {
      const next = { ...prev };
      for (const k of Object.keys(patch)) delete next[`lines.${i}.${k}`];
      delete next.lines;
      return next;
    });
    setValues((v) => ({ ...v, lines: v.lines.map((l, j) => (j === i ? { ...l, ...patch } : l)) }));
  };

  const send = (submit: boolean) => {
    setFormError(null);
    setSaved(null);
    const parseErrors: FieldErrors = {};
    const lines: ReturnCheckInput['lines'] = values.lines.map((l, i) => {
      const returned = parseWhole(l.returned, null);
      const damaged = parseWhole(l.damaged, 0);
      if (!returned.ok || returned.value === null) parseErrors[`lines.${i}.returned`] = returned.ok ? 'Enter how many came back.' : returned.message;
      if (!damaged.ok) parseErrors[`lines.${i}.damaged`] = damaged.message;
      return { key: l.key, returned: returned.ok ? (returned.value ?? 0) : 0, damaged: damaged.ok ? (damaged.value ?? 0) : 0, notes: l.notes };
    });
    if (Object.keys(parseErrors).length) {
      setErrors(parseErrors);
      setFormError('Check the highlighted counts.');
      requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
      return;
    }
    save.mutate(
      { bookingId, lines, notes: values.notes, submit },
      {
        onSuccess: () => setSaved(submit ? 'Check-in finished. The office sees any damage and missing items.' : 'Count saved.'),
        onError: (error) => {
          if (isApiError(error)) setErrors(error.fields);
          setFormError(errorMessage(error));
          requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
        },
      },
    );
  };

  if (finished) {
    return (
      <div className="space-y-4">
        <Alert tone="success" title="Checked in.">
          {check.submittedBy ? `${check.submittedBy}, ` : ''}
          {formatZoned(check.submittedAt, booking.timeZone)}.
        </Alert>
        {saved ? <p className="sr-only" role="status">{saved}</p> : null}
        <ul className="divide-y divide-canvas-100 rounded-lg border border-canvas-200 bg-white text-sm">
          {check.lines.map((l) => (
            <li key={l.key} className="px-3 py-2">
              <p className="font-semibold">{l.description}</p>
              <p>
                {l.returned} of {l.sent} back{l.missing ? `, ${l.missing} missing` : ''}
                {l.damaged ? `, ${l.damaged} damaged` : ''}
              </p>
              {l.notes ? <p className="text-canvas-700">{l.notes}</p> : null}
            </li>
          ))}
        </ul>
        {check.notes ? <p className="text-sm whitespace-pre-line">{check.notes}</p> : null}
      </div>
    );
  }

  if (!editable) {
    return <p className="text-sm text-canvas-700">The check-in opens once the stock is out: mark the delivery first.</p>;
  }

  return (
    <form
      ref={formRef}
      noValidate
      aria-label="Pickup check-in"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        send(true);
      }}
    >
      {errors.lines ? <Alert tone="danger">{errors.lines}</Alert> : null}
      <ol className="space-y-4">
        {check.lines.map((line, i) => {
          const v = values.lines[i];
          const returned = parseWhole(v.returned, null);
          const damaged = parseWhole(v.damaged, 0);
          const missing = returned.ok && returned.value !== null ? line.sent - returned.value : null;
          const hasDamage = damaged.ok && (damaged.value ?? 0) > 0;
          const photos = booking.photos.filter((p) => p.stage === 'damage' && p.lineKey === line.key);
          return (
            <li key={line.key} className="rounded-lg border border-canvas-200 bg-white p-3">
              <fieldset className="space-y-3">
                <legend className="font-semibold text-canvas-900">
                  {line.description} <span className="font-normal text-canvas-700">· {line.sent} went out</span>
                </legend>
                <div className="grid grid-cols-2 gap-3">
                  <TextField
                    label={<>Came back<span className="sr-only">, {line.description}</span></>}
                    inputMode="numeric"
                    value={v.returned}
                    onChange={(e) => setLine(i, { returned: e.target.value })}
                    error={errors[`lines.${i}.returned`]}
                  />
                  <TextField
                    label={<>Damaged<span className="sr-only">, {line.description}</span></>}
                    inputMode="numeric"
                    value={v.damaged}
                    onChange={(e) => setLine(i, { damaged: e.target.value })}
                    error={errors[`lines.${i}.damaged`]}
                  />
                </div>
                {missing !== null && missing > 0 ? <p className="text-sm font-semibold text-rust-800">{missing} missing</p> : null}
                {hasDamage || v.notes || errors[`lines.${i}.notes`] ? (
                  <TextArea
                    label={<>What is damaged<span className="sr-only">, {line.description}</span></>}
                    rows={2}
                    value={v.notes}
                    onChange={(e) => setLine(i, { notes: e.target.value })}
                    error={errors[`lines.${i}.notes`]}
                  />
                ) : null}
                {hasDamage ? (
                  <>
                    <PhotoList photos={photos} bookingId={bookingId} empty="No damage photos yet." />
                    <PhotoUpload bookingId={bookingId} stage="damage" lineKey={line.key} label={<>Photo of the damage<span className="sr-only">, {line.description}</span></>} />
                  </>
                ) : null}
              </fieldset>
            </li>
          );
        })}
      </ol>
      <TextArea label="Notes for the office" rows={3} value={values.notes} onChange={(e) => setValues((x) => ({ ...x, notes: e.target.value }))} />
      <FormMessage message={formError} />
      {saved ? <Alert tone="success">{saved}</Alert> : null}
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" isLoading={save.isPending && !save.variables?.submit} disabled={save.isPending} onClick={() => send(false)}>
          Save count
        </Button>
        <Button type="submit" isLoading={save.isPending && !!save.variables?.submit} disabled={save.isPending}>
          Finish check-in
        </Button>
      </div>
    </form>
  );
}
