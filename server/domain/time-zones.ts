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
