// The shoot and release calendar: a public feed at a secret URL, and its address for the producer.
import { Router } from 'express';
import { z } from 'zod';
import { buildOf } from '../middleware/build';
import { buildScopedRouter } from './buildScoped';
import * as calendar from '../services/calendar';
import { send } from './send';
import { CalendarAddress } from '../../shared/contracts/calendar';

/** GET /api/calendar/:token.ics — no sign-in: calendar apps fetch it on their own. */
export function calendarFeedRouter() {
  const router = Router();
  router.get('/:token.ics', async (req, res) => {
    const text = await calendar.calendarFeed(z.string().max(200).parse(req.params.token));
    res.set('Content-Type', 'text/calendar; charset=utf-8');
    res.set('Cache-Control', 'private, max-age=300');
    res.set('Content-Disposition', 'inline; filename="bayslate.ics"');
    res.send(text);
  });
  return router;
}

/** /api/builds/:buildId/calendar — the subscribe URL and rotating it (owner, producer). */
export function buildCalendarRouter() {
  return buildScopedRouter()
    .get('/', { roles: ['producer'] }, async (req, res) => {
      send(res, CalendarAddress, await calendar.calendarInfo(buildOf(req)));
    })
    .post('/rotate', { roles: ['producer'] }, async (req, res) => {
      send(res, CalendarAddress, await calendar.rotateCalendar(req.user!, buildOf(req)));
    }).router;
}
