// Calendar-day arithmetic on ISO dates (YYYY-MM-DD) as whole UTC day numbers, free of time zones.

const DAY_MS = 86_400_000;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Days since 1970-01-01 for an ISO date; throws on anything else, since a bad date is a caller bug. */
export function toDay(iso: string): number {
  const m = ISO_DATE.exec(iso);
  if (!m) throw new RangeError(`Not an ISO date (YYYY-MM-DD): ${iso}`);
  const ms = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
  const day = ms / DAY_MS;
  if (fromDay(day) !== iso) throw new RangeError(`Not a calendar date: ${iso}`);
  return day;
}

/** The ISO date of a day number. */
export function fromDay(day: number): string {
  return new Date(day * DAY_MS).toISOString().slice(0, 10);
}

export function addDays(iso: string, days: number): string {
  return fromDay(toDay(iso) + days);
}
