import { Chip } from '@/components/ui/chip';
import { TextField } from '@/components/ui/text-field';
import { QUICK_RANGES, QUICK_RANGE_LABELS, quickRange, quickRangeOf, type DateRange } from './date-ranges';

interface ExportRangeFieldsProps {
  value: DateRange;
  onChange: (next: DateRange) => void;
  errors: Partial<Record<'from' | 'to', string>>;
  /** Today on the company's calendar, for the quick picks. */
  today: string;
  timeZoneLabel: string;
}

/** The dates every export covers: first and last day (both included), with quick picks. */
export function ExportRangeFields({ value, onChange, errors, today, timeZoneLabel }: ExportRangeFieldsProps) {
  const picked = quickRangeOf(value, today);
  return (
    <fieldset className="space-y-4">
      <legend className="text-lg font-semibold text-canvas-900">Dates</legend>
      <div className="flex flex-wrap gap-2" role="group" aria-label="Quick picks">
        {QUICK_RANGES.map((q) => (
          <Chip key={q} pressed={picked === q} onClick={() => onChange(quickRange(q, today))}>
            {QUICK_RANGE_LABELS[q]}
          </Chip>
        ))}
      </div>
      <div className="grid gap-4 sm:grid-cols-2 sm:max-w-xl">
        <TextField
          label="First day"
          type="date"
          value={value.from}
          max={value.to || undefined}
          error={errors.from}
          onChange={(e) => onChange({ ...value, from: e.target.value })}
        />
        <TextField
          label="Last day"
          type="date"
          value={value.to}
          min={value.from || undefined}
          error={errors.to}
          hint={`Both days included, on the company’s calendar (${timeZoneLabel}).`}
          onChange={(e) => onChange({ ...value, to: e.target.value })}
        />
      </div>
    </fieldset>
  );
}
