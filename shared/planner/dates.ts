// The planner's day numbers (days since 1970-01-01) for its integer arithmetic, taken from the one
// date module (shared/dates.ts, date-fns): no day arithmetic is written by hand here. The planner
// converts the same few hundred dates over and over, so each answer is remembered.
import { addDays, daysBetween } from '../dates';

export { addDays };

const EPOCH = '1970-01-01';
const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;
const dayOfIso = new Map<string, number>();
const isoOfDay = new Map<number, string>();
const MEMO_LIMIT = 20_000;

/** Days since 1970-01-01 for an ISO date; throws on anything else, since a bad date is a caller bug. */
export function toDay(iso: string): number {
  const known = dayOfIso.get(iso);
  if (known !== undefined) return known;
  if (!ISO_DATE.test(iso)) throw new RangeError(`Not an ISO date (YYYY-MM-DD): ${iso}`);
  const day = daysBetween(EPOCH, iso);
  // "2026-02-30" would roll over into March: a date that does not round-trip is not a calendar date.
  if (fromDay(day) !== iso) throw new RangeError(`Not a calendar date: ${iso}`);
  if (dayOfIso.size > MEMO_LIMIT) dayOfIso.clear();
  dayOfIso.set(iso, day);
  return day;
}

/** The ISO date of a day number. */
export function fromDay(day: number): string {
  const known = isoOfDay.get(day);
  if (known !== undefined) return known;
  const iso = addDays(EPOCH, day);
  if (isoOfDay.size > MEMO_LIMIT) isoOfDay.clear();
  isoOfDay.set(day, iso);
  return iso;
}
