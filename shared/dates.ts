// The one date module for server and client: calendar days (YYYY-MM-DD) and "today" in a build's
// IANA time zone. Zone arithmetic comes from date-fns-tz (the zone database of Intl), never from
// hand-written offsets; day arithmetic works on calendar days, so no zone or DST can shift it.
// Per-function entry points: the packages' index files load every function (a sixth of a second
// of CPU at each server start).
import { addDays as addCalendarDays } from 'date-fns/addDays';
import { toZonedTime } from 'date-fns-tz/toZonedTime';

/** A new build's zone until the owner picks the shop's own. */
export const DEFAULT_TIME_ZONE = 'UTC';

const ISO_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Whether `zone` is an IANA zone name the runtime knows ("America/Denver", "UTC"); offsets such as "+07:00" are not names. */
export function isValidTimeZone(zone: unknown): zone is string {
  if (typeof zone !== 'string' || zone.length === 0 || zone.length > 64) return false;
  if (!/^[A-Za-z][A-Za-z0-9_+-]*(\/[A-Za-z0-9_+-]+)*$/.test(zone)) return false;
  const known = zoneChecks.get(zone);
  if (known !== undefined) return known;
  let ok: boolean;
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: zone });
    ok = true;
  } catch {
    ok = false;
  }
  if (zoneChecks.size > 1000) zoneChecks.clear(); // names come from people: keep the memo small
  zoneChecks.set(zone, ok);
  return ok;
}
/** Building an Intl formatter costs far more than a request should: each answer is kept. */
const zoneChecks = new Map<string, boolean>();

/** Per zone: the day, and the span of instants [from, until) it is known to hold for. */
const days = new Map<string, { day: string; from: number; until: number }>();

/**
 * The calendar day at instant `now` in `zone` (an invalid zone falls back to UTC rather than throw).
 * The answer is reused for at most a second and never past the zone's next midnight.
 */
export function todayIn(zone: string | null | undefined, now: Date = new Date()): string {
  const z = isValidTimeZone(zone) ? zone : DEFAULT_TIME_ZONE;
  const t = now.getTime();
  const known = days.get(z);
  if (known && t >= known.from && t < known.until) return known.day;
  const wall = toZonedTime(now, z); // the zone's wall clock, in a Date's local fields
  const day = isoOf(wall);
  const toMidnight =
    86_400_000 -
    (((wall.getHours() * 60 + wall.getMinutes()) * 60 + wall.getSeconds()) * 1000 + wall.getMilliseconds());
  days.set(z, { day, from: t, until: t + Math.min(1000, toMidnight) });
  return day;
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
  return dayNumber(b) - dayNumber(a);
}

/**
 * Days since 1970-01-01 of a calendar day. Date.UTC has no zone and no DST, so the difference of two
 * day numbers is date-fns' differenceInCalendarDays of the same days. Kept per day: the overview's
 * series ask for the same few hundred days on every request.
 */
function dayNumber(iso: string): number {
  let n = dayNumbers.get(iso);
  if (n === undefined) {
    const m = ISO_DAY.exec(iso);
    if (!m) throw new RangeError(`not a calendar day: ${iso}`);
    n = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) / 86_400_000;
    if (dayNumbers.size > 50_000) dayNumbers.clear();
    dayNumbers.set(iso, n);
  }
  return n;
}
const dayNumbers = new Map<string, number>();
