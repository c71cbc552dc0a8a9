import { SEATING_STYLES, type PlanningRules } from '@shared/schemas/rules';
import { SEATING_LABELS } from './rules-form';

/** The planning rules as text, for a role that sees no prices (the server sends it no others). */
export function PlanningRulesDetails({ rules }: { rules: PlanningRules }) {
  const rows: Array<[string, string]> = [
    ['Turnaround after pickup', `${rules.turnaroundHours} hours`],
    ['Permit above', `${rules.permitAreaSqFt} sq ft (open-sided tents: ${rules.permitOpenSidedAreaSqFt} sq ft)`],
    ['Floor area per guest', SEATING_STYLES.map((s) => `${SEATING_LABELS[s]} ${rules.sqFtPerGuest[s]} sq ft`).join(', ')],
    ['Seats per banquet table', String(rules.seatsPerBanquetTable)],
    ['Wind limit', `${rules.windLimitMph} mph sustained: take tents down or clear them`],
    ['Guests out of the tent at', `${rules.occupiedWindLimitMph} mph sustained`],
  ];
  return (
    <dl className="divide-y divide-canvas-200" aria-label="Planning rules">
      {rows.map(([label, value]) => (
        <div key={label} className="grid gap-1 py-3 sm:grid-cols-3 sm:gap-4">
          <dt className="text-sm font-semibold text-canvas-700">{label}</dt>
          <dd className="text-canvas-900 sm:col-span-2">{value}</dd>
        </div>
      ))}
    </dl>
  );
}
