// The calendar feed on routes/calendar.ts, read back with ical.js (an independent RFC 5545 parser).
import { describe, it, expect, beforeAll } from 'vitest';
import ICAL from 'ical.js';
import { anonymous, signInAs } from '../helpers/api';
import { count } from '../helpers/db';
import { Build, Episode } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

// Every JSON answer these tests read is parsed with its route's contract (shared/contracts).
everyAnswerHasAContract();

let build: Build;

beforeAll(async () => {
  build = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
});

const pathOf = (url: string) => new URL(url).pathname;

function parse(text: string) {
  const cal = new ICAL.Component(ICAL.parse(text));
  return cal.getAllSubcomponents('vevent').map((v) => {
    const e = new ICAL.Event(v);
    return { uid: e.uid, summary: e.summary, start: e.startDate, end: e.endDate };
  });
}

describe('the calendar feed', () => {
  it('the producer gets the subscribe URL; installer 403; anonymous 401', async () => {
    const producer = await signInAs('producer');
    const res = await producer.get(`/api/builds/${build.id}/calendar`);
    expect(res.status).toBe(200);
    expect(res.body.url).toMatch(/\/api\/calendar\/[0-9a-f]{48}\.ics$/);
    expect((await (await signInAs('installer')).get(`/api/builds/${build.id}/calendar`)).status).toBe(403);
    expect((await anonymous().post(`/api/builds/${build.id}/calendar/rotate`).send({})).status).toBe(401);
    expect((await (await signInAs('marketing')).post(`/api/builds/${build.id}/calendar/rotate`).send({})).status).toBe(
      403,
    );
  });

  it('gives shoot days and release dates as all-day events that ical.js reads, with stable UIDs', async () => {
    const url = pathOf((await (await signInAs('producer')).get(`/api/builds/${build.id}/calendar`)).body.url);
    const first = await anonymous().get(url);
    expect(first.status).toBe(200);
    expect(first.headers['content-type']).toContain('text/calendar');
    const events = parse(first.text);
    const eps = await Episode.findAll({ where: { buildId: build.id }, order: [['number', 'ASC']] });
    const expected = eps.flatMap((e) => [
      ...(e.shootDate ? [`episode-${e.id}-shoot@bayslate`] : []),
      ...(e.releaseDate ? [`episode-${e.id}-release@bayslate`] : []),
    ]);
    expect(events.map((e) => e.uid).sort()).toEqual(expected.sort());
    const ep1 = eps[0];
    const shoot = events.find((e) => e.uid === `episode-${ep1.id}-shoot@bayslate`)!;
    expect(shoot.start.isDate).toBe(true);
    expect(shoot.start.toString()).toBe(ep1.shootDate);
    expect(shoot.end.toString()).toBe('2026-10-02');
    expect(shoot.summary).toBe(`Shoot: episode 1, ${ep1.title}`);
    const release = events.find((e) => e.uid === `episode-${ep1.id}-release@bayslate`)!;
    expect(release.start.toString()).toBe(ep1.releaseDate);

    // A moved shoot keeps its UID: the calendar app updates the event instead of adding one.
    const producer = await signInAs('producer');
    const draft = eps.find((e) => e.state === 'draft')!;
    const moved = await producer
      .patch(`/api/builds/${build.id}/episodes/${draft.id}`)
      .send({ shootDate: '2027-03-01', releaseDate: '2027-03-08', version: draft.version });
    expect(moved.status).toBe(200);
    const second = parse((await anonymous().get(url)).text);
    expect(second.map((e) => e.uid).sort()).toEqual(events.map((e) => e.uid).sort());
    expect(second.find((e) => e.uid === `episode-${draft.id}-shoot@bayslate`)!.start.toString()).toBe('2027-03-01');
  });

  it('an unknown or malformed token answers 404', async () => {
    expect((await anonymous().get(`/api/calendar/${'0'.repeat(48)}.ics`)).status).toBe(404);
    expect((await anonymous().get('/api/calendar/not-a-token.ics')).status).toBe(404);
  });

  it('rotating gives a new URL and the old one stops working; it is recorded without the secret', async () => {
    const producer = await signInAs('producer');
    const old = pathOf((await producer.get(`/api/builds/${build.id}/calendar`)).body.url);
    const before = await count('activities');
    const rotated = await producer.post(`/api/builds/${build.id}/calendar/rotate`).send({});
    expect(rotated.status).toBe(200);
    const fresh = pathOf(rotated.body.url);
    expect(fresh).not.toBe(old);
    expect((await anonymous().get(old)).status).toBe(404);
    expect((await anonymous().get(fresh)).status).toBe(200);
    expect(await count('activities')).toBe(before + 1);
    const token = fresh.split('/').pop()!.replace('.ics', '');
    const [rows] = await Build.sequelize!.query(
      `SELECT count(*)::int AS n FROM activities WHERE changes::text LIKE '%${token}%' OR summary LIKE '%${token}%'`,
    );
    expect((rows as { n: number }[])[0].n).toBe(0);
    // The build's version is untouched, so an open settings form does not go stale.
    expect((await Build.findByPk(build.id))!.version).toBe(build.version);
  });

  it("another build's calendar routes answer 404 for an unknown build", async () => {
    const producer = await signInAs('producer');
    expect((await producer.post('/api/builds/999999/calendar/rotate').send({})).status).toBe(404);
  });
});

describe('the calendar feed lookup (issue 10)', () => {
  it('finds the build through the token hash, without loading every build', async () => {
    for (let i = 0; i < 15; i++) {
      await Build.create({
        slug: `cal-lookup-${i}`,
        name: `Lookup ${i}`,
        year: 2020,
        make: 'Halvorsen',
        model: 'Skua',
        vin: null,
        mileage: null,
        budgetCents: null,
        labourRateCents: null,
        campaign: null,
        summary: null,
      });
    }
    const url = (await (await signInAs('producer')).get(`/api/builds/${build.id}/calendar`)).body.url as string;
    let loaded = 0;
    const countRows = (result: unknown) => void (loaded += Array.isArray(result) ? result.length : result ? 1 : 0);
    Build.addHook('afterFind', 'count-loaded', countRows);
    try {
      const res = await anonymous().get(pathOf(url));
      expect(res.status).toBe(200);
      expect(loaded).toBeLessThanOrEqual(1);
      loaded = 0;
      const wrong = await anonymous().get(pathOf(url).replace(/[0-9a-f]{8}\.ics$/, '00000000.ics'));
      expect(wrong.status).toBe(404);
      expect(loaded).toBe(0);
    } finally {
      Build.removeHook('afterFind', 'count-loaded');
    }
  });
});
