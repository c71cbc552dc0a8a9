import type { PlannerLine, PlannerResult } from '@shared/schemas/planner';
import { SEATING_STYLES, type SeatingStyle } from '@shared/schemas/rules';
import { Alert } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { errorMessage } from '@/lib/api';
import { usePlanTent } from '../api/plan-tent';

const SEATING_WORDS: Record<SeatingStyle, string> = { banquet: 'banquet tables', rows: 'rows of chairs', standing: 'standing', mixed: 'mixed' };

interface PlannerPanelProps {
  guests: number;
  seating: SeatingStyle;
  afterDark: boolean;
  openSided: boolean;
  onOpenSidedChange: (open: boolean) => void;
  /** Adds a recommendation's lines to the booking; absent when the booking cannot be changed. */
  onAddLines?: (lines: PlannerLine[]) => void;
}

function Figures({ result }: { result: PlannerResult }) {
  const rows: Array<[string, React.ReactNode]> = [
    ['Tent area', `${result.areaSqFt} sq ft`],
    [
      'Occupant load (IFC 2018 Table 1004.5)',
      `${result.occupantLoad.tablesAndChairs} at tables and chairs · ${result.occupantLoad.chairsOnly} in rows of chairs · ${result.occupantLoad.standing} standing`,
    ],
    ['Most the fire code official may approve (§1004.5.1)', `${result.increasedLoadCap} people`],
    [
      'Exits for an enclosed tent (Table 3103.12.2)',
      result.exits ? `${result.exits.count} exits, each at least ${result.exits.minWidthIn} in wide, ${result.exits.totalWidthIn} in in all, for ${result.designOccupants} people` : '—',
    ],
    ['Permit', result.permitLikely ? <Badge tone="caution">Likely needed</Badge> : 'Not by the threshold in your rules'],
    ['Sidewall sections for the perimeter', result.sidewallSections],
  ];
  return (
    <dl className="divide-y divide-canvas-200 text-sm">
      {rows.map(([label, value]) => (
        <div key={label} className="grid gap-1 py-2 sm:grid-cols-2 sm:gap-4">
          <dt className="font-semibold text-canvas-700">{label}</dt>
          <dd className="text-canvas-900">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

/**
 * From the guest count and seating: which tent, tables, chairs, sidewalls and lights from your
 * stock, the occupant loads and exits, the permit, and the cautions with their sources.
 */
export function PlannerPanel({ guests, seating, afterDark, openSided, onOpenSidedChange, onAddLines }: PlannerPanelProps) {
  const planner = usePlanTent();
  const result = planner.data;
  const canPlan = guests > 0 && (SEATING_STYLES as readonly string[]).includes(seating);

  return (
    <div className="space-y-4">
      <p className="text-sm text-canvas-700">
        Plans for {guests > 0 ? `${guests} guests` : 'the guest count'} ({SEATING_WORDS[seating]}){afterDark ? ', after dark' : ''}, from the booking’s details above.
      </p>
      <div className="flex flex-wrap items-center gap-4">
        <Checkbox label="The tent stays open on all sides" checked={openSided} onChange={(e) => onOpenSidedChange(e.target.checked)} />
        <Button variant="secondary" disabled={!canPlan} isLoading={planner.isPending} onClick={() => planner.mutate({ guests, seating, afterDark, openSided })}>
          Plan the tent
        </Button>
      </div>
      {!canPlan ? <p className="text-sm text-canvas-600">Enter the guest count first.</p> : null}
      <div aria-live="polite" className="space-y-4">
        {planner.isError ? <Alert tone="danger">{errorMessage(planner.error)}</Alert> : null}
        {result ? (
          <>
            {result.overLoad ? <Alert tone="warning" title="Too many guests for the floor area">{result.overLoad.message}</Alert> : null}
            {result.recommendations.length === 0 ? (
              <Alert tone="warning" title="No tent in your stock fits.">
                See the cautions below for what you can do.
              </Alert>
            ) : (
              <ol className="space-y-3">
                {result.recommendations.map((rec, i) => (
                  <li key={rec.itemId} className="rounded-md border border-canvas-200 p-3">
                    <div className="flex flex-wrap items-start justify-between gap-2">
                      <div>
                        <h3 className="font-semibold text-canvas-900">
                          {i === 0 ? 'Best fit: ' : 'Also fits: '}
                          {rec.name}
                        </h3>
                        <p className="text-sm text-canvas-700">
                          {rec.widthFt} x {rec.lengthFt} ft, {rec.areaSqFt} sq ft, holds {rec.capacity} guests
                        </p>
                      </div>
                      {onAddLines ? (
                        <Button size="sm" onClick={() => onAddLines(rec.lines)}>
                          Add these lines<span className="sr-only"> for {rec.name}</span>
                        </Button>
                      ) : null}
                    </div>
                    <ul className="mt-2 space-y-1 text-sm">
                      {rec.lines.map((line) => (
                        <li key={line.itemId}>
                          <span className="font-semibold tabular-nums">{line.quantity} ×</span> {line.name} <span className="text-canvas-600">— {line.reason}</span>
                        </li>
                      ))}
                    </ul>
                    {rec.notes.length ? (
                      <ul className="mt-2 space-y-1 text-sm text-ochre-800">
                        {rec.notes.map((n) => (
                          <li key={n}>{n}</li>
                        ))}
                      </ul>
                    ) : null}
                  </li>
                ))}
              </ol>
            )}
            {result.areaSqFt > 0 ? <Figures result={result} /> : null}
            <section aria-labelledby="cautions-heading" className="rounded-md border border-ochre-200 bg-ochre-50 p-4">
              <h3 id="cautions-heading" className="font-semibold text-ochre-800">
                Cautions
              </h3>
              <p className="mt-1 text-sm text-ochre-800">
                These figures inform, they do not approve. The local fire code, the authority having jurisdiction and the tent maker’s instructions come first.
              </p>
              <ul className="mt-2 space-y-2 text-sm text-canvas-900">
                {result.cautions.map((c) => (
                  <li key={c.text}>
                    {c.text} <span className="text-canvas-700">Source: {c.source}.</span>
                  </li>
                ))}
              </ul>
            </section>
          </>
        ) : null}
      </div>
    </div>
  );
}
