// The per-build shoot and release calendar (RFC 5545) at a secret URL, and rotating that secret.
import { createHash, timingSafeEqual } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import ical, { ICalCalendarMethod } from 'ical-generator';
import { sequelize, Build, Episode } from '../models';
import { newCalendarToken } from '../models/build';
import { config } from '../config';
import { notFound } from '../errors';
import { record, type Actor } from './activity';
import { EPISODE_STATE_LABELS, type EpisodeState } from '../../shared/domain';

const TOKEN_SHAPE = /^[0-9a-f]{32,128}$/;

export const calendarUrl = (token: string) => `${config().publicUrl}/api/calendar/${token}.ics`;

/**
 * Finds the build whose token matches, by the token's SHA-256 through a unique index (migration
 * 0015): the lookup's timing depends on the hash, not on how much of a guess was right. The token
 * is then compared in constant time as well.
 */
export async function buildForToken(token: string): Promise<Build> {
  if (!TOKEN_SHAPE.test(token)) throw notFound('Calendar');
  const hash = createHash('sha256').update(token).digest('hex');
  const rows = await sequelize.query<{ id: number }>('SELECT id FROM builds WHERE calendar_token_hash = :hash', {
    replacements: { hash },
    type: QueryTypes.SELECT,
  });
  const build = rows[0] ? await Build.findByPk(rows[0].id) : null;
  const given = Buffer.from(token);
  const mine = Buffer.from(build?.calendarToken ?? '');
  if (!build || mine.length !== given.length || !timingSafeEqual(mine, given)) throw notFound('Calendar');
  return build;
}

/** Day after an ISO date: the exclusive end of an all-day event. */
function nextDay(iso: string) {
  const d = new Date(`${iso}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 1);
  return d;
}

export async function calendarFeed(token: string): Promise<string> {
  const build = await buildForToken(token);
  const episodes = await Episode.findAll({ where: { buildId: build.id }, order: [['number', 'ASC']] });
  const cal = ical({
    name: `${build.name}: shoots and releases`,
    prodId: { company: 'Bayslate', product: 'shoot-calendar', language: 'EN' },
    method: ICalCalendarMethod.PUBLISH,
    ttl: 60 * 60,
  });
  for (const ep of episodes) {
    // UIDs name the episode and the kind of day, never the date, so a moved shoot updates the
    // event a calendar app already has instead of adding a second one.
    const common = { stamp: ep.updatedAt, lastModified: ep.updatedAt, sequence: ep.version, allDay: true };
    const state = EPISODE_STATE_LABELS[ep.state as EpisodeState];
    if (ep.shootDate) {
      cal.createEvent({
        ...common,
        id: `episode-${ep.id}-shoot@bayslate`,
        start: new Date(`${ep.shootDate}T00:00:00Z`),
        end: nextDay(ep.shootDate),
        summary: `Shoot: episode ${ep.number}, ${ep.title}`,
        description: `${build.name} · episode ${ep.number} (${state}) is filmed in the bay.`,
      });
    }
    if (ep.releaseDate) {
      cal.createEvent({
        ...common,
        id: `episode-${ep.id}-release@bayslate`,
        start: new Date(`${ep.releaseDate}T00:00:00Z`),
        end: nextDay(ep.releaseDate),
        summary: `Release: episode ${ep.number}, ${ep.title}`,
        description: `${build.name} · episode ${ep.number} (${state}) goes out.`,
        url: ep.videoUrl ?? undefined,
      });
    }
  }
  return cal.toString();
}

export async function calendarInfo(build: Build) {
  return { url: calendarUrl(build.calendarToken) };
}

/** A new secret: the old URL stops working at once. */
export async function rotateCalendar(actor: Actor, build: Build) {
  return sequelize.transaction(async (t) => {
    const token = newCalendarToken();
    // A plain UPDATE: the token is not a field of the build form, so its version stays put.
    await sequelize.query('UPDATE builds SET calendar_token = :token WHERE id = :id', {
      replacements: { token, id: build.id },
      transaction: t,
    });
    // The secret itself never goes into the activity record.
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'build',
      entityId: build.id,
      action: 'calendar_rotate',
      summary: 'Replaced the calendar feed address; the old one no longer works',
      changes: {},
    });
    return { url: calendarUrl(token) };
  });
}
