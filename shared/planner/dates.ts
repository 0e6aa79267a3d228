// The planner's day numbers (days since 1970-01-01) for its integer arithmetic, taken from the one
// date module (shared/dates.ts, date-fns): no day arithmetic is written by hand here.
import { addDays, daysBetween } from '../dates';

export { addDays };

const EPOCH = '1970-01-01';
const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/** Days since 1970-01-01 for an ISO date; throws on anything else, since a bad date is a caller bug. */
export function toDay(iso: string): number {
  if (!ISO_DATE.test(iso)) throw new RangeError(`Not an ISO date (YYYY-MM-DD): ${iso}`);
  const day = daysBetween(EPOCH, iso);
  // "2026-02-30" would roll over into March: a date that does not round-trip is not a calendar date.
  if (fromDay(day) !== iso) throw new RangeError(`Not a calendar date: ${iso}`);
  return day;
}

/** The ISO date of a day number. */
export function fromDay(day: number): string {
  return addDays(EPOCH, day);
}
