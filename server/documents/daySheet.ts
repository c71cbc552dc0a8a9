/**
 * The printable day sheet: the day's stops in time order, then the load list, written as
 * Markdown (with the engine's table blocks) and laid out by the same pdfkit renderer and fonts
 * as every other document. No prices: it goes on the truck.
 */
import { timeInZone } from '../../shared/dates';
import type { LoadSection } from '../../shared/loadList';
import type { DaySheet, FieldStop } from '../../shared/schemas/field';
import { blockMarkdown } from './blocks';
import { renderPdf } from './pdf';
import { escapeMarkdown as esc } from './template';

const SEATING_WORDS = { banquet: 'banquet tables', rows: 'rows of chairs', standing: 'standing', mixed: 'tables and standing' } as const;

function longDate(date: string): string {
  const [y, m, d] = date.split('-').map(Number);
  return new Intl.DateTimeFormat('en-US', { weekday: 'long', year: 'numeric', month: 'long', day: 'numeric', timeZone: 'UTC' }).format(new Date(Date.UTC(y, m - 1, d)));
}

function stopMarkdown(s: FieldStop, tz: string): string {
  const window = `${timeInZone(new Date(s.windowStart), tz)}–${timeInZone(new Date(s.windowEnd), tz)}`;
  const lines = [
    `## ${window} ${s.stop === 'delivery' ? 'Delivery' : 'Pickup'}: ${esc(s.reference)}, ${esc(s.customer.name)}`,
    '',
    `- **Site:** ${esc(s.site.address || 'No address on the booking: call the office.')}`,
    s.customer.phone ? `- **Customer phone:** ${esc(s.customer.phone)}` : '',
    `- **Ground:** ${s.site.surface}, anchored with ${s.site.anchoring}`,
    s.guestCount ? `- **Guests:** ${s.guestCount}, ${SEATING_WORDS[s.seating]}${s.afterDark ? ', after dark' : ''}` : '',
    `- **Crew:** ${s.crew.length ? esc(s.crew.map((c) => c.name).join(', ')) : 'not assigned'}`,
    s.site.notes ? `- **Site notes:** ${esc(s.site.notes.replace(/\s*\n\s*/g, ' '))}` : '',
  ].filter((l) => l !== '');
  const table = s.items.length
    ? blockMarkdown({ type: 'table', columns: [{ label: 'Item', align: 'left' }, { label: 'Quantity', align: 'right' }], rows: s.items.map((i) => [i.name, String(i.quantity)]), totals: [] })
    : '\nNo stock on this booking.\n';
  return `${lines.join('\n')}\n${table}`;
}

function sectionMarkdown(title: string, section: LoadSection): string {
  if (!section.groups.length) return `## ${title}\n\nNothing.\n`;
  const rows: string[][] = [];
  for (const g of section.groups) {
    for (const r of g.rows) rows.push([g.label, r.name, String(r.quantity), r.references.join(', ')]);
  }
  const hw = section.hardware;
  const hardware = [
    hw.poles ? `${hw.poles} poles` : '',
    hw.stakes ? `${hw.stakes} stakes` : '',
    hw.ballastLbs ? `${hw.ballastLbs.toLocaleString('en-US')} lb of ballast` : '',
  ].filter(Boolean);
  return [
    `## ${title}`,
    blockMarkdown({
      type: 'table',
      columns: [{ label: 'Kind', align: 'left' }, { label: 'Item', align: 'left' }, { label: 'Quantity', align: 'right' }, { label: 'Bookings', align: 'left' }],
      rows,
      totals: [],
    }),
    hardware.length ? `**Tent hardware:** ${hardware.join(', ')}.` : '',
    ...section.notes.map((n) => `- ${esc(n)}`),
    '',
  ].filter((l) => l !== '').join('\n\n');
}

export function daySheetMarkdown(sheet: DaySheet, companyName: string): string {
  const parts = [
    `# Day sheet: ${longDate(sheet.date)}`,
    `${esc(companyName)}. Times are local (${esc(sheet.timeZone)}). ${sheet.stops.length} stop${sheet.stops.length === 1 ? '' : 's'}.`,
    '> No stake goes in until the utility locate (811, or the local one-call center) is recorded on the site checklist, or the site is a hard surface held with ballast. Watch the wind limits; the tent maker’s instructions, the fire code official and licensed practice come first.',
    ...sheet.stops.map((s) => stopMarkdown(s, sheet.timeZone)),
    sectionMarkdown('Load list: leaves the yard', sheet.loadList.outgoing),
    sectionMarkdown('Load list: comes back', sheet.loadList.returning),
  ];
  if (!sheet.stops.length) parts.splice(3, 0, 'No deliveries or pickups on this day.');
  return parts.join('\n\n');
}

export function renderDaySheetPdf(sheet: DaySheet, company: { name: string; logo?: Buffer | null }): Promise<Buffer> {
  return renderPdf({
    markdown: daySheetMarkdown(sheet, company.name),
    title: `Day sheet ${sheet.date}`,
    company,
    documentLabel: `Day sheet ${sheet.date}`,
  });
}
