/** Time-zone arithmetic with Intl only (no Node or browser APIs beyond it). */

// One formatter per zone: building an Intl.DateTimeFormat costs far more than using one (tens of
// microseconds, and a list of 50 bookings asks for hundreds of dates).
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatter(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit',
    });
    formatters.set(timeZone, f);
  }
  return f;
}

function parts(instant: number, timeZone: string) {
  const p = Object.fromEntries(formatter(timeZone).formatToParts(new Date(instant)).map((x) => [x.type, x.value]));
  return { y: +p.year, m: +p.month, d: +p.day, h: +p.hour, min: +p.minute, s: +p.second };
}

/** The zone's offset from UTC at that instant, in minutes (e.g. -300 for UTC-5). */
export function zoneOffsetMinutes(instant: number, timeZone: string): number {
  const p = parts(instant, timeZone);
  const asUtc = Date.UTC(p.y, p.m - 1, p.d, p.h, p.min, p.s);
  return Math.round((asUtc - Math.floor(instant / 1000) * 1000) / 60_000);
}

/** The instant of a wall-clock time (YYYY-MM-DD and HH:MM) in a time zone. */
export function zonedTimeToInstant(date: string, time: string, timeZone: string): Date {
  const [y, m, d] = date.split('-').map(Number);
  const [hh, mm] = time.split(':').map(Number);
  const wall = Date.UTC(y, m - 1, d, hh, mm);
  // Two passes settle the offset across a daylight-saving change.
  let guess = wall - zoneOffsetMinutes(wall, timeZone) * 60_000;
  guess = wall - zoneOffsetMinutes(guess, timeZone) * 60_000;
  return new Date(guess);
}

/** YYYY-MM-DD of an instant in a time zone. */
export function dateInZone(instant: Date | number, timeZone: string): string {
  const p = parts(typeof instant === 'number' ? instant : instant.getTime(), timeZone);
  return `${p.y}-${String(p.m).padStart(2, '0')}-${String(p.d).padStart(2, '0')}`;
}

/** HH:MM of an instant in a time zone. */
export function timeInZone(instant: Date | number, timeZone: string): string {
  const p = parts(typeof instant === 'number' ? instant : instant.getTime(), timeZone);
  return `${String(p.h).padStart(2, '0')}:${String(p.min).padStart(2, '0')}`;
}

/** The date after a YYYY-MM-DD date (calendar arithmetic in UTC, no zone involved). */
export function addDays(date: string, days: number): string {
  const [y, m, d] = date.split('-').map(Number);
  return new Date(Date.UTC(y, m - 1, d + days)).toISOString().slice(0, 10);
}

/** The calendar days of a time zone that [from, to) touches, with each day's start and end instants. */
export function zonedDays(from: Date, to: Date, timeZone: string): { date: string; start: Date; end: Date }[] {
  const days: { date: string; start: Date; end: Date }[] = [];
  let date = dateInZone(from, timeZone);
  for (let i = 0; i < 800; i++) {
    const start = zonedTimeToInstant(date, '00:00', timeZone);
    if (start >= to) break;
    const next = addDays(date, 1);
    days.push({ date, start, end: zonedTimeToInstant(next, '00:00', timeZone) });
    date = next;
  }
  return days;
}
