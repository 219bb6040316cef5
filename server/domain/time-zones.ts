/** IANA time-zone names as the running engine knows them (Node 20 and current browsers do). */
export function listTimeZones(): string[] {
  const intl = Intl as unknown as { supportedValuesOf?: (key: string) => string[] };
  return intl.supportedValuesOf ? ['UTC', ...intl.supportedValuesOf('timeZone').filter((z) => z !== 'UTC')] : ['UTC'];
}

export function isTimeZone(value: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: value });
    return value.length > 0 && value.length <= 64;
  } catch {
    return false;
  }
}

/**
 * A date and time as a person reads it in a time zone, with the zone named so it cannot be
 * misread: "Thursday, 10 December 2026 at 17:00 (Europe/Lisbon)". Used in e-mails and messages.
 */
const FORMATS = new Map<string, Intl.DateTimeFormat>();

/** A date and time in words in a zone, the zone named; one formatter per zone, made once (a sweep formats thousands). */
export function formatInZone(date: Date, timeZone: string): string {
  let format = FORMATS.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-GB', { dateStyle: 'full', timeStyle: 'short', timeZone });
    FORMATS.set(timeZone, format);
  }
  return `${format.format(date)} (${timeZone})`;
}

/** The zone this device is set to (the browser's, on the web), or UTC when it cannot say. */
export function deviceTimeZone(): string {
  try {
    const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;
    return zone && isTimeZone(zone) ? zone : 'UTC';
  } catch {
    return 'UTC';
  }
}
