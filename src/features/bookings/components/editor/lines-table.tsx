import { useId } from 'react';
import { formatMoney } from '@shared/money';
import type { ShortfallDetail } from '@shared/schemas/bookings';
import { ITEM_KIND_LABELS, ITEM_KINDS, type ItemRow } from '@shared/schemas/items';
import { Button } from '@/components/ui/button';
import { controlClasses } from '@/components/ui/field';
import { cn } from '@/lib/cn';
import type { FieldErrors } from '@/lib/form';
import { emptyLine, lineFromItem, type LineState } from './editor-state';

interface LinesTableProps {
  lines: LineState[];
  items: readonly ItemRow[];
  errors: FieldErrors;
  currency: string;
  showPrices: boolean;
  readOnly: boolean;
  /** Per catalog item: what is free over the booking's window (live, or as loaded). */
  availability: Map<string, Pick<ShortfallDetail, 'available' | 'shortfall'>>;
  checking: boolean;
  /** Net of each line from the live quote, by position. */
  lineTotals: (number | null)[];
  onChange: (lines: LineState[]) => void;
}

function Cell({ label, error, className, children }: { label: string; error?: string; className?: string; children: (id: string, describedBy?: string) => React.ReactNode }) {
  const id = useId();
  return (
    <td className={cn('px-2 py-2 align-top', className)}>
      <label htmlFor={id} className="sr-only">
        {label}
      </label>
      {children(id, error ? `${id}-error` : undefined)}
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-xs font-semibold text-rust-700">
          {error}
        </p>
      ) : null}
    </td>
  );
}

export function LinesTable({ lines, items, errors, currency, showPrices, readOnly, availability, checking, lineTotals, onChange }: LinesTableProps) {
  const byId = new Map(items.map((i) => [i.id, i]));
  const set = (index: number, patch: Partial<LineState>) => onChange(lines.map((l, i) => (i === index ? { ...l, ...patch } : l)));
  const input = (index: number, name: keyof LineState, errorKey: string, label: string, opts: { className?: string; inputMode?: 'numeric' | 'decimal'; width?: string } = {}) => (
    <Cell label={`${label}, line ${index + 1}`} error={errors[`lines.${index}.${errorKey}`]} className={cn(opts.className, opts.width)}>
      {(id, describedBy) => (
        <input
          id={id}
          inputMode={opts.inputMode}
          aria-invalid={errors[`lines.${index}.${errorKey}`] ? true : undefined}
          aria-describedby={describedBy}
          className={controlClasses(Boolean(errors[`lines.${index}.${errorKey}`]), 'px-2 py-1 text-sm')}
          value={String(lines[index][name])}
          onChange={(e) => set(index, { [name]: e.target.value } as Partial<LineState>)}
        />
      )}
    </Cell>
  );

  const pickItem = (index: number, itemId: string) => {
    const item = byId.get(itemId);
    if (!item) return set(index, { itemId: '' });
    const fresh = lineFromItem(item, Number(lines[index].quantity) || 1);
    // Choosing another item brings its name and list prices; quantity and extra days stay.
    set(index, { ...fresh, key: lines[index].key, extraDays: lines[index].extraDays });
  };

  const grouped = ITEM_KINDS.map((kind) => ({ kind, items: items.filter((i) => i.kind === kind) })).filter((g) => g.items.length);

  return (
    <div className="space-y-3">
      <div className="relative overflow-x-auto rounded-lg border border-canvas-200 bg-white">
        <table className="min-w-full text-left text-sm">
          <caption className="sr-only">Booking lines</caption>
          <thead className="bg-canvas-100 text-canvas-700">
            <tr>
              <th scope="col" className="px-2 py-2 font-semibold">
                #
              </th>
              <th scope="col" className="px-2 py-2 font-semibold">Item</th>
              <th scope="col" className="px-2 py-2 font-semibold">Description</th>
              <th scope="col" className="px-2 py-2 font-semibold">Qty</th>
              <th scope="col" className="px-2 py-2 font-semibold">Free</th>
              {showPrices ? (
                <>
                  <th scope="col" className="px-2 py-2 font-semibold">Unit price</th>
                  <th scope="col" className="px-2 py-2 font-semibold">Extra days</th>
                  <th scope="col" className="px-2 py-2 font-semibold">Extra-day price</th>
                  <th scope="col" className="px-2 py-2 font-semibold">Discount %</th>
                  <th scope="col" className="px-2 py-2 font-semibold">Discount $</th>
                </>
              ) : null}
              <th scope="col" className="px-2 py-2 font-semibold">Taxable</th>
              <th scope="col" className="px-2 py-2 font-semibold">Kind</th>
              {showPrices ? <th scope="col" className="px-2 py-2 text-right font-semibold">Line total</th> : null}
              {readOnly ? null : (
                <th scope="col" className="px-2 py-2">
                  <span className="sr-only">Remove</span>
                </th>
              )}
            </tr>
          </thead>
          <tbody className="divide-y divide-canvas-200">
            {lines.length === 0 ? (
              <tr>
                <td colSpan={14} className="px-4 py-6 text-center text-canvas-600">
                  No lines yet. Add items from the catalog, a free-text line or a fee, or use the planner below.
                </td>
              </tr>
            ) : null}
            {lines.map((line, i) => {
              const a = line.itemId ? availability.get(line.itemId) : undefined;
              const short = a && a.shortfall > 0;
              const inactive = line.itemId && !byId.has(line.itemId);
              return (
                <tr key={line.key} className={short ? 'bg-rust-50' : undefined}>
                  <th scope="row" className="px-2 py-3 align-top font-semibold tabular-nums">
                    {i + 1}
                  </th>
                  <Cell label={`Item, line ${i + 1}`} error={errors[`lines.${i}.itemId`]} className="min-w-52">
                    {(id, describedBy) => (
                      <select
                        id={id}
                        data-line-item={i}
                        aria-describedby={describedBy}
                        className={controlClasses(Boolean(errors[`lines.${i}.itemId`]), 'px-2 py-1 text-sm')}
                        value={line.itemId}
                        onChange={(e) => pickItem(i, e.target.value)}
                      >
                        <option value="">Free text (no item)</option>
                        {inactive ? <option value={line.itemId}>{line.description} (inactive)</option> : null}
                        {grouped.map((g) => (
                          <optgroup key={g.kind} label={ITEM_KIND_LABELS[g.kind]}>
                            {g.items.map((item) => (
                              <option key={item.id} value={item.id}>
                                {item.name}
                              </option>
                            ))}
                          </optgroup>
                        ))}
                      </select>
                    )}
                  </Cell>
                  {input(i, 'description', 'description', 'Description', { width: 'min-w-48' })}
                  {input(i, 'quantity', 'quantity', 'Quantity', { inputMode: 'numeric', width: 'min-w-20' })}
                  <td className="px-2 py-3 align-top whitespace-nowrap">
                    {!line.itemId || (!a && byId.get(line.itemId)?.kind === 'service') ? (
                      <span className="text-canvas-500">—</span>
                    ) : a ? (
                      short ? (
                        <span className="font-semibold text-rust-800">
                          {a.available} free: short {a.shortfall}
                        </span>
                      ) : (
                        <span className="text-pine-800">{a.available} free</span>
                      )
                    ) : checking ? (
                      <span className="text-canvas-600">Checking…</span>
                    ) : (
                      <span className="text-canvas-600">Enter the dates</span>
                    )}
                  </td>
                  {showPrices ? (
                    <>
                      {input(i, 'unitPrice', 'unitPriceCents', 'Unit price', { inputMode: 'decimal', width: 'min-w-28' })}
                      {input(i, 'extraDays', 'extraDays', 'Extra days', { inputMode: 'numeric', width: 'min-w-20' })}
                      {input(i, 'extraDayPrice', 'extraDayPriceCents', 'Extra-day price', { inputMode: 'decimal', width: 'min-w-28' })}
                      {input(i, 'discountPercent', 'discountBp', 'Discount %', { inputMode: 'decimal', width: 'min-w-20' })}
                      {input(i, 'discountAmount', 'discountCents', 'Discount amount', { inputMode: 'decimal', width: 'min-w-28' })}
                    </>
                  ) : null}
                  <td className="px-2 py-3 align-top">
                    <input type="checkbox" aria-label={`Taxable, line ${i + 1}`} className="size-5 accent-pine-700" checked={line.taxable} onChange={(e) => set(i, { taxable: e.target.checked })} />
                  </td>
                  <Cell label={`Kind, line ${i + 1}`} className="min-w-24">
                    {(id) => (
                      <select id={id} className={controlClasses(false, 'px-2 py-1 text-sm')} value={line.kind} onChange={(e) => set(i, { kind: e.target.value as LineState['kind'] })}>
                        <option value="rental">Rental</option>
                        <option value="fee">Fee</option>
                      </select>
                    )}
                  </Cell>
                  {showPrices ? <td className="px-2 py-3 text-right align-top whitespace-nowrap tabular-nums">{lineTotals[i] === null || lineTotals[i] === undefined ? '—' : formatMoney(lineTotals[i]!, currency)}</td> : null}
                  {readOnly ? null : (
                    <td className="px-2 py-2 align-top">
                      <Button size="sm" variant="ghost" className="text-rust-700 hover:bg-rust-50" onClick={() => onChange(lines.filter((_, j) => j !== i))}>
                        Remove<span className="sr-only"> line {i + 1}</span>
                      </Button>
                    </td>
                  )}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {errors.lines ? <p className="text-sm font-semibold text-rust-700">{errors.lines}</p> : null}
      {readOnly ? null : (
        <div className="flex flex-wrap gap-2">
          <Button size="sm" variant="secondary" onClick={() => onChange([...lines, emptyLine('rental')])}>
            Add a line
          </Button>
          <Button size="sm" variant="secondary" onClick={() => onChange([...lines, { ...emptyLine('fee'), taxable: false }])}>
            Add a fee
          </Button>
        </div>
      )}
    </div>
  );
}
