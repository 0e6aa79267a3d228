// The one date module for server and client: calendar days (YYYY-MM-DD) and "today" in a build's
// IANA time zone. Zone arithmetic comes from date-fns-tz (the zone database of Intl), never from
// hand-written offsets; day arithmetic works on calendar days, so no zone or DST can shift it.
import { addDays as addCalendarDays, differenceInCalendarDays } from 'date-fns';
import { formatInTimeZone } from 'date-fns-tz';

/** A new build's zone until the owner picks the shop's own. */
export const DEFAULT_TIME_ZONE = 'UTC';

const ISO_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Whether `zone` is an IANA zone name the runtime knows ("America/Denver", "UTC"); offsets such as "+07:00" are not names. */
export function isValidTimeZone(zone: unknown): zone is string {
  if (typeof zone !== 'string' || zone.length === 0 || zone.length > 64) return false;
  if (!/^[A-Za-z][A-Za-z0-9_+-]*(\/[A-Za-z0-9_+-]+)*$/.test(zone)) return false;
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

/** The calendar day at instant `now` in `zone` (an invalid zone falls back to UTC rather than throw). */
export function todayIn(zone: string | null | undefined, now: Date = new Date()): string {
  return formatInTimeZone(now, isValidTimeZone(zone) ? zone : DEFAULT_TIME_ZONE, 'yyyy-MM-dd');
}

/** The calendar day of an instant (a timestamp) in `zone`. */
export function dayOf(instant: Date | string | number, zone: string | null | undefined): string {
  return todayIn(zone, new Date(instant));
}

/** A calendar day as a local-midnight Date, for date-fns' calendar arithmetic only (never shown). */
function local(iso: string): Date {
  const m = ISO_DAY.exec(iso);
  if (!m) throw new RangeError(`not a calendar day: ${iso}`);
  return new Date(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
}
const isoOf = (d: Date) =>
  `${String(d.getFullYear()).padStart(4, '0')}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;

/** `iso` moved by `days` calendar days. */
export function addDays(iso: string, days: number): string {
  return isoOf(addCalendarDays(local(iso), days));
}

/** Calendar days from `a` to `b` (positive when b is later). */
export function daysBetween(a: string, b: string): number {
  return differenceInCalendarDays(local(b), local(a));
}
