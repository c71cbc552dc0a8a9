import type { LoadSection } from '@shared/loadList';

function Section({ title, section, headingId }: { title: string; section: LoadSection; headingId: string }) {
  const hw = section.hardware;
  const hardware = [hw.poles ? `${hw.poles} poles` : '', hw.stakes ? `${hw.stakes} stakes` : '', hw.ballastLbs ? `${hw.ballastLbs.toLocaleString('en-US')} lb of ballast` : ''].filter(Boolean);
  return (
    <section aria-labelledby={headingId} className="space-y-3">
      <h2 id={headingId} className="text-lg font-semibold text-canvas-900">
        {title}
      </h2>
      {section.groups.length === 0 ? <p className="text-sm text-canvas-600">Nothing.</p> : null}
      {hardware.length ? (
        <p className="rounded-md bg-pine-50 px-3 py-2 text-sm text-pine-900">
          <span className="font-semibold">Tent hardware:</span> {hardware.join(', ')}
        </p>
      ) : null}
      {section.groups.map((g) => (
        <div key={g.group} className="rounded-lg border border-canvas-200 bg-white">
          <h3 className="flex justify-between border-b border-canvas-100 px-3 py-2 font-semibold text-canvas-900">
            <span>{g.label}</span>
            <span className="tabular-nums" aria-label={`${g.total} in all`}>
              {g.total}
            </span>
          </h3>
          <ul className="divide-y divide-canvas-100 text-sm">
            {g.rows.map((r) => (
              <li key={r.itemId ?? r.name} className="flex items-start justify-between gap-3 px-3 py-2">
                <span>
                  {r.name}
                  <span className="block text-xs text-canvas-600">{r.references.join(', ')}</span>
                </span>
                <span className="font-semibold tabular-nums">{r.quantity}</span>
              </li>
            ))}
          </ul>
        </div>
      ))}
      {section.notes.length ? (
        <ul className="list-disc space-y-1 pl-5 text-sm text-rust-800">
          {section.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}

/** What leaves the yard and what comes back on a day. */
export function LoadListView({ loadList }: { loadList: { outgoing: LoadSection; returning: LoadSection } }) {
  return (
    <div className="grid gap-8 lg:grid-cols-2">
      <Section title="Leaves the yard" section={loadList.outgoing} headingId="load-out" />
      <Section title="Comes back" section={loadList.returning} headingId="load-back" />
    </div>
  );
}
