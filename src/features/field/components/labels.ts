import type { FieldStop } from '@shared/schemas/field';

export const SURFACE_LABELS: Record<FieldStop['site']['surface'], string> = {
  grass: 'Grass',
  soil: 'Bare soil',
  gravel: 'Gravel',
  asphalt: 'Asphalt',
  concrete: 'Concrete',
};

export const ANCHORING_LABELS: Record<FieldStop['site']['anchoring'], string> = {
  stakes: 'Staked',
  ballast: 'Ballast (weights)',
};

export const SEATING_WORDS: Record<FieldStop['seating'], string> = {
  banquet: 'at banquet tables',
  rows: 'in rows of chairs',
  standing: 'standing',
  mixed: 'at tables and standing',
};

/** "9:00 AM" on the company's clock. */
export function clock(iso: string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-US', { hour: 'numeric', minute: '2-digit', timeZone }).format(new Date(iso));
}

/** "9:00 AM – 1:00 PM". */
export const timeWindow = (start: string, end: string, timeZone: string) => `${clock(start, timeZone)} – ${clock(end, timeZone)}`;

/** "Friday, June 11, 2027" for a YYYY-MM-DD date. */
export function longDate(date: string): string {
  const [y, m, d] = date.split('-').map(Number);
  return new Intl.DateTimeFormat('en-US', { weekday: 'long', month: 'long', day: 'numeric', year: 'numeric', timeZone: 'UTC' }).format(new Date(Date.UTC(y, m - 1, d)));
}

/** The calendar date `days` after a YYYY-MM-DD date. */
export function shiftDate(date: string, days: number): string {
  const [y, m, d] = date.split('-').map(Number);
  return new Date(Date.UTC(y, m - 1, d + days)).toISOString().slice(0, 10);
}

/** Where a stop stands, in a few words, for its badge. */
export function stopState(stop: FieldStop): { label: string; tone: 'neutral' | 'positive' | 'caution' } {
  if (stop.stop === 'pickup') return stop.progress.checkedInAt ? { label: 'Checked in', tone: 'positive' } : { label: 'To pick up', tone: 'neutral' };
  if (stop.progress.setUpAt) return { label: 'Set up', tone: 'positive' };
  if (stop.progress.deliveredAt) return { label: 'Delivered', tone: 'caution' };
  return { label: 'To deliver', tone: 'neutral' };
}
