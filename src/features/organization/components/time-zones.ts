/** The browser's list of IANA time zones, with the current value kept even if the list lacks it. */
export function timeZoneOptions(current: string): string[] {
  let zones: string[] = [];
  try {
    zones = Intl.supportedValuesOf('timeZone');
  } catch {
    zones = [];
  }
  if (!zones.includes('UTC')) zones = [...zones, 'UTC'];
  if (current && !zones.includes(current)) zones = [current, ...zones];
  return zones;
}

export function browserTimeZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
}
