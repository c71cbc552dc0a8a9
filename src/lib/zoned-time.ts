/**
 * Wall-clock times in the company's time zone. A datetime-local input gives "2027-06-12T14:00"
 * with no zone; the API takes an instant with its offset ("2027-06-12T14:00:00-05:00"). The
 * offset is the company's, not the browser's, so an office on the road enters local event times.
 */

function partsIn(utcMs: number, timeZone: string) {
  const dtf = new Intl.DateTimeFormat('en-US', {
    timeZone,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    second: '2-digit',
  });
  const p = Object.fromEntries(dtf.formatToParts(new Date(utcMs)).map((x) => [x.type, x.value]));
  return { year: +p.year, month: +p.month, day: +p.day, hour: +p.hour % 24, minute: +p.minute, second: +p.second };
}

/** Minutes the zone is ahead of UTC at that instant (-300 for Chicago in winter). */
export function offsetMinutes(utcMs: number, timeZone: string): number {
  const p = partsIn(utcMs, timeZone);
  const asUtc = Date.UTC(p.year, p.month - 1, p.day, p.hour, p.minute, p.second);
  return Math.round((asUtc - Math.floor(utcMs / 1000) * 1000) / 60_000);
}

function formatOffset(minutes: number): string {
  const sign = minutes < 0 ? '-' : '+';
  const abs = Math.abs(minutes);
  return `${sign}${String(Math.floor(abs / 60)).padStart(2, '0')}:${String(abs % 60).padStart(2, '0')}`;
}

/** "2027-06-12T14:00" in `timeZone` -> "2027-06-12T14:00:00-05:00"; null when not a date-time. */
export function zonedInputToIso(value: string, timeZone: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})/.exec(value.trim());
  if (!m) return null;
  const wall = Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5]);
  if (Number.isNaN(wall)) return null;
  let offset = offsetMinutes(wall, timeZone);
  let utc = wall - offset * 60_000;
  // Near a clock change the first guess can be an hour off; one more step settles it.
  const again = offsetMinutes(utc, timeZone);
  if (again !== offset) {
    offset = again;
    utc = wall - offset * 60_000;
  }
  const local = new Date(utc + offset * 60_000).toISOString().slice(0, 19);
  return `${local}${formatOffset(offset)}`;
}

/** An instant -> "2027-06-12T14:00" on the company's clock, for a datetime-local input. */
export function isoToZonedInput(iso: string | null | undefined, timeZone: string): string {
  if (!iso) return '';
  const utc = Date.parse(iso);
  if (Number.isNaN(utc)) return '';
  return new Date(utc + offsetMinutes(utc, timeZone) * 60_000).toISOString().slice(0, 16);
}

/** YYYY-MM-DD of an instant on the company's calendar. */
export function zonedDate(iso: string | number | Date, timeZone: string): string {
  const d = iso instanceof Date ? iso : new Date(iso);
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(d);
}

/** "2027-06" for the month an instant falls in on the company's calendar. */
export const zonedMonth = (iso: string | number | Date, timeZone: string) => zonedDate(iso, timeZone).slice(0, 7);

/** Parses "2027-06" (falls back to `fallback`). */
export function parseMonth(text: string | null | undefined, fallback: string): { year: number; month: number } {
  const m = /^(\d{4})-(\d{2})$/.exec(text ?? '') ?? /^(\d{4})-(\d{2})$/.exec(fallback);
  const year = m ? +m[1] : 2000;
  const month = m ? Math.min(12, Math.max(1, +m[2])) : 1;
  return { year, month };
}

export const monthKey = (year: number, month: number) => `${year}-${String(month).padStart(2, '0')}`;

export function shiftMonth(key: string, by: number): string {
  const { year, month } = parseMonth(key, key);
  const index = year * 12 + (month - 1) + by;
  return monthKey(Math.floor(index / 12), (index % 12) + 1);
}

/** The instants where a month starts and the next begins, on the company's calendar. */
export function monthRange(key: string, timeZone: string): { from: string; to: string } {
  return {
    from: zonedInputToIso(`${key}-01T00:00`, timeZone) ?? `${key}-01T00:00:00Z`,
    to: zonedInputToIso(`${shiftMonth(key, 1)}-01T00:00`, timeZone) ?? `${shiftMonth(key, 1)}-01T00:00:00Z`,
  };
}

/**
 * The weeks of a month grid, Sunday first: each cell a YYYY-MM-DD or null for the days of the
 * neighbouring months.
 */
export function monthWeeks(key: string): (string | null)[][] {
  const { year, month } = parseMonth(key, key);
  const first = new Date(Date.UTC(year, month - 1, 1));
  const days = new Date(Date.UTC(year, month, 0)).getUTCDate();
  const cells: (string | null)[] = Array.from({ length: first.getUTCDay() }, () => null);
  for (let d = 1; d <= days; d += 1) cells.push(`${key}-${String(d).padStart(2, '0')}`);
  while (cells.length % 7 !== 0) cells.push(null);
  const weeks: (string | null)[][] = [];
  for (let i = 0; i < cells.length; i += 7) weeks.push(cells.slice(i, i + 7));
  return weeks;
}

export function monthLabel(key: string): string {
  const { year, month } = parseMonth(key, key);
  return new Intl.DateTimeFormat('en-US', { month: 'long', year: 'numeric', timeZone: 'UTC' }).format(new Date(Date.UTC(year, month - 1, 1)));
}

/** A date-time on the company's clock for people: "Jun 12, 2027, 2:00 PM". */
export function formatZoned(iso: string | null | undefined, timeZone: string, withTime = true): string {
  if (!iso) return '';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return new Intl.DateTimeFormat('en-US', withTime ? { dateStyle: 'medium', timeStyle: 'short', timeZone } : { dateStyle: 'medium', timeZone }).format(d);
}

/** A YYYY-MM-DD calendar date for people: "Jun 12, 2027". */
export function formatCalendarDate(date: string | null | undefined): string {
  if (!date) return '';
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return date;
  return new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeZone: 'UTC' }).format(new Date(Date.UTC(+m[1], +m[2] - 1, +m[3])));
}

/** A YYYY-MM-DD date moved by whole days on the calendar (no time zone, no DST). */
export function addCalendarDays(date: string, days: number): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return date;
  return new Date(Date.UTC(+m[1], +m[2] - 1, +m[3]) + days * 86_400_000).toISOString().slice(0, 10);
}
