import type { SiteSafety } from '@shared/siteSafety';

/** The numbers the crew checks the site against, and the cautions with where each comes from. */
export function SafetyPanel({ safety }: { safety: SiteSafety }) {
  return (
    <div className="space-y-4 text-sm">
      <dl className="grid gap-2 sm:grid-cols-2">
        <div className="rounded-md border border-ochre-200 bg-ochre-50 px-3 py-2 text-ochre-900">
          <dt className="font-semibold">Guests out of the tent at</dt>
          <dd>
            {safety.wind.occupied.mph} mph sustained · {safety.wind.occupied.label}
          </dd>
        </div>
        <div className="rounded-md border border-rust-200 bg-rust-50 px-3 py-2 text-rust-900">
          <dt className="font-semibold">Stop work and take the tent down at</dt>
          <dd>
            {safety.wind.takeDown.mph} mph sustained · {safety.wind.takeDown.label}
          </dd>
        </div>
      </dl>
      {safety.tents.length ? (
        <div>
          <h3 className="font-semibold text-canvas-900">Occupancy and exits</h3>
          <ul className="mt-1 space-y-1">
            {safety.tents.map((t, i) => (
              <li key={`${t.name}-${i}`}>
                <span className="font-semibold">{t.name}</span> ({t.areaSqFt} sq ft): at most {t.occupantLoad} guests for this seating; {t.exits.count} exits, each at
                least {t.exits.minWidthIn} in wide, {t.exits.totalWidthIn} in in all.
                {t.permitLikely ? ' Likely needs a permit.' : ''}
              </li>
            ))}
          </ul>
          <p className={safety.overLoad ? 'mt-1 font-semibold text-rust-800' : 'mt-1 text-canvas-700'}>
            Booked for {safety.guestCount} guests; the tents hold {safety.totalOccupantLoad} by the fire code’s table.
          </p>
        </div>
      ) : null}
      <div>
        <h3 className="font-semibold text-canvas-900">Cautions</h3>
        <ul className="mt-1 space-y-2">
          {safety.cautions.map((c) => (
            <li key={c.text} className="border-l-4 border-ochre-300 pl-3">
              {c.text}
              <span className="block text-xs text-canvas-600">Source: {c.source}</span>
            </li>
          ))}
        </ul>
      </div>
    </div>
  );
}
