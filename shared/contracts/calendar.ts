// Contracts of the build's calendar address (/api/builds/:buildId/calendar, producer and owner).
// The feed itself (/api/calendar/:token.ics) is text/calendar, not JSON.
import { z } from 'zod';
import type { RouteTable } from './common';

export const CalendarAddress = z.object({ url: z.string() });
export type CalendarAddress = z.infer<typeof CalendarAddress>;

export const calendarRoutes = {
  'GET /api/builds/:buildId/calendar': CalendarAddress,
  'POST /api/builds/:buildId/calendar/rotate': CalendarAddress,
} satisfies RouteTable;
