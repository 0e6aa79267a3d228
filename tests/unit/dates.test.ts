// The one date module: "today" in a build's IANA zone at a fixed clock, calendar-day arithmetic, zone names.
import { describe, expect, it } from 'vitest';
import { addDays, dayOf, daysBetween, isValidTimeZone, todayIn } from '../../shared/dates';

describe('todayIn', () => {
  it('is still the 14th at 23:30 in Denver when UTC has moved on to the 15th', () => {
    // 2026-03-14 23:30 in Denver is MDT (UTC−6 from the second Sunday of March, 2026-03-08): 05:30 UTC on the 15th.
    const clock = new Date('2026-03-15T05:30:00Z');
    expect(todayIn('America/Denver', clock)).toBe('2026-03-14');
    expect(todayIn('UTC', clock)).toBe('2026-03-15');
  });

  it('follows standard time in winter (MST, UTC−7)', () => {
    // 2026-12-01 23:30 MST = 2026-12-02 06:30 UTC.
    expect(todayIn('America/Denver', new Date('2026-12-02T06:30:00Z'))).toBe('2026-12-01');
    expect(todayIn('America/Denver', new Date('2026-12-02T07:00:00Z'))).toBe('2026-12-02');
  });

  it('falls back to UTC for a zone that is not a name, and gives the day of an instant', () => {
    expect(todayIn('Mars/Olympus', new Date('2026-03-15T05:30:00Z'))).toBe('2026-03-15');
    expect(dayOf('2026-07-04T03:00:00Z', 'America/Denver')).toBe('2026-07-03');
  });
});

describe('calendar days', () => {
  it('adds days across month, leap day and DST changes', () => {
    expect(addDays('2024-02-28', 1)).toBe('2024-02-29');
    expect(addDays('2025-02-28', 1)).toBe('2025-03-01');
    expect(addDays('2026-03-07', 2)).toBe('2026-03-09'); // over the US spring-forward night
    expect(addDays('2026-01-05', -10)).toBe('2025-12-26');
    expect(daysBetween('2026-03-01', '2026-04-01')).toBe(31);
    expect(daysBetween('2026-04-01', '2026-03-01')).toBe(-31);
  });

  it('counts days between calendar days over leap days, DST nights and year ends (counted by hand)', () => {
    expect(daysBetween('2024-02-28', '2024-03-01')).toBe(2); // 2024 is a leap year: the 29th lies between
    expect(daysBetween('2025-02-28', '2025-03-01')).toBe(1);
    expect(daysBetween('2026-03-07', '2026-03-09')).toBe(2); // over the US spring-forward night (8 March 2026)
    expect(daysBetween('2026-10-31', '2026-11-02')).toBe(2); // over the US fall-back night (1 November 2026)
    expect(daysBetween('1999-12-31', '2000-01-01')).toBe(1);
    expect(daysBetween('2025-01-02', '2026-01-02')).toBe(365);
    expect(daysBetween('2026-05-05', '2026-05-05')).toBe(0);
    // Asked again (the answer is kept per day): the same.
    expect(daysBetween('2024-02-28', '2024-03-01')).toBe(2);
    expect(() => daysBetween('2026-5-5', '2026-05-06')).toThrow(RangeError);
  });
});

describe('isValidTimeZone', () => {
  it('accepts IANA names and refuses anything else', () => {
    for (const z of ['America/Denver', 'UTC', 'Europe/Berlin', 'America/Argentina/Buenos_Aires'])
      expect(isValidTimeZone(z), z).toBe(true);
    for (const z of ['', 'Mountain', '+07:00', 'America/Nowhere', 'America/Denver; DROP', 42, null])
      expect(isValidTimeZone(z), String(z)).toBe(false);
  });
});
