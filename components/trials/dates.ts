import dayjs from 'dayjs';
import customParseFormat from 'dayjs/plugin/customParseFormat';
import timezone from 'dayjs/plugin/timezone';
import utc from 'dayjs/plugin/utc';

dayjs.extend(utc);
dayjs.extend(timezone);
dayjs.extend(customParseFormat);

export const LOCAL_FORMAT = 'YYYY-MM-DD HH:mm';

/** An instant shown as wall time in a time zone, e.g. "2027-03-01 18:00". */
export function toLocalText(iso: string | Date, timeZone: string): string {
  return dayjs(iso).tz(timeZone).format(LOCAL_FORMAT);
}

/** Wall time typed in a time zone back to an ISO instant; null when it is not a real date and time. */
export function fromLocalText(text: string, timeZone: string): string | null {
  const trimmed = text.trim();
  if (!dayjs(trimmed, LOCAL_FORMAT, true).isValid()) return null;
  return dayjs.tz(trimmed, LOCAL_FORMAT, timeZone).toISOString();
}

/** "Friday 5 March 2027, 18:00 (Europe/Lisbon)". */
export function describeInstant(iso: string | Date, timeZone: string): string {
  return `${dayjs(iso).tz(timeZone).format('dddd D MMMM YYYY, HH:mm')} (${timeZone})`;
}

/** "14:02" in a time zone: when something happened today, e.g. a save. */
export function timeOfDay(iso: string | Date, timeZone: string): string {
  return dayjs(iso).tz(timeZone).format('HH:mm');
}
